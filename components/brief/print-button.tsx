"use client";

/** Opens the browser's print dialog for the brief (the print CSS lays it out on A4). */
export function PrintButton() {
  return (
    <button type="button" className="btn-quiet" onClick={() => window.print()}>
      Print
    </button>
  );
}
