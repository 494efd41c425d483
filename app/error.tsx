"use client";

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <>
      <h1>This page could not be shown</h1>
      <p className="empty">
        The server could not read the books for this page{error.digest ? ` (reference ${error.digest})` : ""}. Check that the database is
        migrated, then try again.
      </p>
      <p>
        <button type="button" onClick={reset}>
          Try again
        </button>
      </p>
    </>
  );
}
