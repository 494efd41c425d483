"use client";
import "./globals.css";

// Shown when even the layout cannot be drawn; the reference is also in the server's log.
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
            Something went wrong on the server and nothing was saved.
            {error.digest ? ` Tell your administrator this reference: ${error.digest}` : ""}
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
