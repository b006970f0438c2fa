"use client";

import { useId } from "react";

// Filter controls for the toolbars of the server-paged tables (review queue, audit log).

const selectClass = "min-h-12 rounded-lg border-2 border-steel-700 bg-white px-3 text-lg font-normal";

/** Whether a typed job number can be sent as a filter (digits or nothing). */
export function jobNumberFilter(typed: string): { ok: boolean; value: string } {
  const trimmed = typed.trim();
  const ok = /^\d*$/.test(trimmed);
  return { ok, value: ok ? trimmed : "" };
}

/** A job-number box that says at once when it holds anything but digits. */
export function JobNumberFilter({ value, onChange }: { value: string; onChange: (v: string) => void }) {
  const errorId = useId();
  const { ok } = jobNumberFilter(value);
  return (
    <label className="flex flex-col gap-1 text-base font-bold">
      Job number
      <input
        inputMode="numeric"
        value={value}
        onChange={(e) => onChange(e.target.value)}
        aria-invalid={!ok}
        aria-describedby={ok ? undefined : errorId}
        className="min-h-12 w-32 rounded-lg border-2 border-steel-700 bg-white px-3 text-lg font-normal aria-[invalid=true]:border-fail"
      />
      {!ok && (
        <span id={errorId} className="text-sm text-fail">
          ✖ digits only
        </span>
      )}
    </label>
  );
}

/** A labelled drop-down filter; the first option is the "no filter" one. */
export function SelectFilter({
  label,
  value,
  onChange,
  options,
}: {
  label: string;
  value: string;
  onChange: (v: string) => void;
  options: ReadonlyArray<{ value: string; label: string }>;
}) {
  return (
    <label className="flex flex-col gap-1 text-base font-bold">
      {label}
      <select value={value} onChange={(e) => onChange(e.target.value)} className={selectClass}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </label>
  );
}
