"use client";

import { BigButton } from "./big-button";

const KEYS = ["7", "8", "9", "4", "5", "6", "1", "2", "3", "−", "0", "."];

/** The entry exactly as typed; `parseEntry` turns it into a number without rounding. */
export function parseEntry(text: string): number | null {
  const t = text.replace("−", "-");
  if (!/^-?\d+(\.\d+)?$/.test(t)) return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : null;
}

/** A large on-screen number pad (no system keyboard). */
export function NumberKeypad({ value, onChange, label }: { value: string; onChange: (v: string) => void; label: string }) {
  function press(k: string) {
    if (k === "−") onChange(value.startsWith("−") ? value.slice(1) : `−${value}`);
    else if (k === "." && value.includes(".")) return;
    else if (value.replace("−", "").length < 12) onChange(value + k);
  }
  return (
    <div className="flex flex-col gap-2">
      <div className="flex gap-2">
        <output
          aria-label={label}
          data-testid="keypad-display"
          className="flex min-h-target flex-1 items-center justify-end rounded-xl border-4 border-steel-900 bg-white px-4 font-mono text-4xl"
        >
          {value || <span className="text-steel-500">0</span>}
        </output>
        <BigButton tone="plain" aria-label="Delete last digit" onClick={() => onChange(value.slice(0, -1))}>
          ⌫
        </BigButton>
      </div>
      <div className="grid grid-cols-3 gap-2">
        {KEYS.map((k) => (
          <button
            key={k}
            type="button"
            aria-label={k === "−" ? "Minus" : k === "." ? "Decimal point" : `Digit ${k}`}
            onClick={() => press(k)}
            className="min-h-target rounded-xl border-2 border-steel-700 bg-white font-mono text-3xl font-bold active:bg-signal"
          >
            {k}
          </button>
        ))}
      </div>
    </div>
  );
}
