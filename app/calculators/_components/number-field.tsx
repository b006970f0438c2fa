"use client";

// A labelled number input for the calculators (typed at a desk or on a tablet keyboard).
export function NumberField({
  label,
  unit,
  value,
  onChange,
  id,
  hint,
}: {
  label: string;
  unit: string;
  value: string;
  onChange: (v: string) => void;
  id: string;
  /** The range the field takes, in words, shown under it. */
  hint?: string;
}) {
  return (
    <label htmlFor={id} className="flex flex-col gap-1 text-base font-bold">
      {label} <span className="font-normal text-steel-700">({unit})</span>
      <input
        id={id}
        inputMode="decimal"
        value={value}
        onChange={(e) => onChange(e.target.value)}
        className="min-h-12 rounded-lg border-2 border-steel-700 bg-white px-3 font-mono text-lg"
      />
      {hint && <span className="text-sm font-normal text-steel-700">{hint}</span>}
    </label>
  );
}

/** The number typed, or a message naming the field. */
export function readNumber(label: string, text: string): number {
  const t = text.trim().replace(",", ".");
  if (!/^-?\d+(\.\d+)?$/.test(t)) throw new Error(`${label}: enter a number (got "${text}")`);
  return Number(t);
}

export function fixed(x: number, digits: number): string {
  return x.toFixed(digits);
}
