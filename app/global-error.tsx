"use client";
import "./globals.css";

// Shown when even the layout cannot read the books (for example, the database is not migrated yet).
export default function GlobalError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <html lang="en">
      <body>
        <header className="site-header">
          <div className="brand">
            <span className="brand-name">Tracevat</span>
          </div>
        </header>
        <main id="main">
          <h1>Tracevat could not start this page</h1>
          <p className="empty">
            The server could not read the books{error.digest ? ` (reference ${error.digest})` : ""}. Check that the database exists and is
            migrated, then try again.
          </p>
          <p>
            <button type="button" onClick={reset}>
              Try again
            </button>
          </p>
        </main>
      </body>
    </html>
  );
}
