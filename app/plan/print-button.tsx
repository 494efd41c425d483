"use client";

export function PrintButton() {
  return (
    <button type="button" className="primary no-print" onClick={() => window.print()}>
      Print the card
    </button>
  );
}
