"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";

const ITEMS: ReadonlyArray<readonly [string, string]> = [
  ["/", "Today"],
  ["/sources", "Sources"],
  ["/pickups", "Pickups"],
  ["/collect", "Collect"],
  ["/receiving", "Receiving"],
  ["/lots", "Lots"],
  ["/labels", "Labels"],
  ["/lab", "Lab"],
  ["/tanks", "Tanks"],
  ["/plan", "Plan a batch"],
  ["/batches", "Batches"],
  ["/products", "Product lots"],
  ["/specs", "Specifications"],
  ["/shipments", "Shipments"],
  ["/waste", "Waste"],
  ["/trace", "Trace"],
  ["/balance", "Balance"],
  ["/periods", "Periods"],
  ["/ledger", "Ledger"],
  ["/admin/users", "Accounts"],
  ["/grid", "Grid"],
  ["/references", "References"],
];

export function MainNav() {
  const path = usePathname();
  const isCurrent = (href: string) => (href === "/" ? path === "/" : path === href || path.startsWith(`${href}/`));
  return (
    <nav className="main-nav" aria-label="Main">
      <ul>
        {ITEMS.map(([href, label]) => (
          <li key={href}>
            <Link href={href} aria-current={isCurrent(href) ? "page" : undefined}>
              {label}
            </Link>
          </li>
        ))}
      </ul>
    </nav>
  );
}
