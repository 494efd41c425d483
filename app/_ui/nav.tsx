"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";
import { useState } from "react";

/**
 * The role's own menu (drawn from the read matrix by the layout). On a narrow screen it folds behind
 * one "Menu" button that names the current page, so the work stays at the top of a phone's screen.
 */
export function MainNav({ items }: { items: ReadonlyArray<{ href: string; label: string }> }) {
  const path = usePathname();
  const [open, setOpen] = useState(false);
  const isCurrent = (href: string) => (href === "/" ? path === "/" : path === href || path.startsWith(`${href}/`));
  const current = items.find((i) => isCurrent(i.href));
  return (
    <nav className={`main-nav${open ? " open" : ""}`} aria-label="Main">
      <button
        type="button"
        className="menu-toggle"
        aria-expanded={open}
        aria-controls="main-menu"
        onClick={() => setOpen((o) => !o)}
      >
        Menu{current ? <span className="menu-current"> · {current.label}</span> : null}
      </button>
      <ul id="main-menu">
        {items.map(({ href, label }) => (
          <li key={href}>
            <Link href={href} aria-current={isCurrent(href) ? "page" : undefined} onClick={() => setOpen(false)}>
              {label}
            </Link>
          </li>
        ))}
      </ul>
    </nav>
  );
}
