"use client";

/** Prints the shipment page as a loading document (site header and controls left out). */
export function PrintShipment() {
  return (
    <button type="button" onClick={() => window.print()}>
      Print
    </button>
  );
}
