"use client";

export function PrintLabels({ what }: { what: string }) {
  return (
    <button type="button" className="primary" onClick={() => window.print()}>
      Print {what}
    </button>
  );
}
