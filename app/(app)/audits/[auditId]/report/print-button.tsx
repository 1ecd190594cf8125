"use client";

export function PrintButton() {
  return (
    <button
      type="button"
      onClick={() => window.print()}
      className="rounded-plot bg-leaf px-4 py-2 text-sm font-medium text-white hover:bg-leaf-deep print:hidden"
      data-testid="print-button"
    >
      Print or save as PDF
    </button>
  );
}
