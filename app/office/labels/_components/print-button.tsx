"use client";

export function PrintButton() {
  return (
    <button type="button" onClick={() => window.print()} className="min-h-12 rounded-lg bg-steel-900 px-5 text-lg font-bold text-white">
      Print the sheet
    </button>
  );
}
