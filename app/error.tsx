"use client";

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <>
      <h1>This page could not be shown</h1>
      <p className="empty">
        Something went wrong on the server and nothing was saved.
        {error.digest ? (
          <>
            {" "}
            Tell your administrator this reference: <strong className="code">{error.digest}</strong>
          </>
        ) : null}
      </p>
      <p>
        <button type="button" onClick={reset}>
          Try again
        </button>
      </p>
    </>
  );
}
