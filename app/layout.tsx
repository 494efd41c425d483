import Link from "next/link";
import { SignOutGuard } from "@/app/_ui/sign-out-guard";
import type { Metadata } from "next";
import type { ReactNode } from "react";
import { MainNav } from "@/app/_ui/nav";
import { loadHeader } from "@/app/_ui/site";
import { signOutAction } from "@/app/login/actions";
import { labelOf } from "@/lib/core/vocabulary";
import { menuFor } from "@/lib/auth/read-matrix";
import "./globals.css";

// Every page reads the books; nothing is prerendered at build time (the not-found page included).
export const dynamic = "force-dynamic";

export const metadata: Metadata = {
  title: { default: "Tracevat", template: "%s · Tracevat" },
  description: "Feedstock inventory and traceability for a biodiesel plant.",
};

export default async function RootLayout({ children }: { children: ReactNode }) {
  const { site, user } = await loadHeader();
  return (
    <html lang="en">
      <body>
        <a className="skip-link" href="#main">
          Skip to content
        </a>
        <header className="site-header">
          <div className="brand">
            <span className="brand-name">Tracevat</span>
            <span className="brand-site">{site ? `${site.name} · ${site.town}` : user ? "No site set up" : ""}</span>
          </div>
          {user ? (
            <form action={signOutAction} className="who">
              <span>
                <Link href="/me" className="who-link" title="Your settings">
                  {user.fullName}
                </Link>{" "}
                <span className="muted">({labelOf(user.role)})</span>
              </span>
              <button type="submit" className="link-button">
                Sign out
              </button>
            </form>
          ) : null}
          {user ? <MainNav items={menuFor(user.role)} /> : null}
          {user ? <SignOutGuard /> : null}
        </header>
        <main id="main" tabIndex={-1}>
          {children}
        </main>
        <footer className="site-footer">
          Masses are book stock from the movement ledger, kept in whole grams. Records are never deleted: corrections
          are new entries with a reason.
        </footer>
      </body>
    </html>
  );
}
