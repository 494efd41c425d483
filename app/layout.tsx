import type { Metadata } from "next";
import type { ReactNode } from "react";
import { MainNav } from "@/app/_ui/nav";
import { loadSite } from "@/app/_ui/site";
import "./globals.css";

// Every page reads the books; nothing is prerendered at build time (the not-found page included).
export const dynamic = "force-dynamic";

export const metadata: Metadata = {
  title: { default: "Tracevat", template: "%s · Tracevat" },
  description: "Feedstock inventory and traceability for a biodiesel plant.",
};

export default async function RootLayout({ children }: { children: ReactNode }) {
  const { site } = await loadSite();
  return (
    <html lang="en">
      <body>
        <a className="skip-link" href="#main">
          Skip to content
        </a>
        <header className="site-header">
          <div className="brand">
            <span className="brand-name">Tracevat</span>
            <span className="brand-site">{site ? `${site.name} · ${site.town}` : "No site set up"}</span>
          </div>
          <MainNav />
        </header>
        <main id="main" tabIndex={-1}>
          {children}
        </main>
        <footer className="site-footer">Read-only view of the books. Masses are book stock from the movement ledger.</footer>
      </body>
    </html>
  );
}
