"use client";

import type { ReactNode } from "react";

/**
 * One thing the supervisor must settle before approving (a reading out of tolerance, a flagged
 * entry): what it is, a large "let it stand" check and, once ticked, the written reason.
 */
export function LetStandItem({
  children,
  checked,
  onCheck,
  checkLabel,
  whyLabel,
  why,
  onWhy,
  error,
  testId,
  errorTestId,
}: {
  children: ReactNode;
  checked: boolean;
  onCheck: (v: boolean) => void;
  checkLabel: string;
  whyLabel: string;
  why: string;
  onWhy: (v: string) => void;
  error: string | undefined;
  testId: string;
  errorTestId: string;
}) {
  return (
    <li className={`rounded-lg border-2 p-3 ${error ? "border-fail" : "border-steel-300"}`} data-testid={testId}>
      {children}
      <label className="mt-2 flex min-h-12 items-center gap-3 text-lg font-bold">
        <input type="checkbox" className="h-7 w-7" checked={checked} onChange={(e) => onCheck(e.target.checked)} />
        {checkLabel}
      </label>
      {checked && (
        <label className="mt-1 flex flex-col gap-1 text-base font-bold">
          {whyLabel}
          <textarea
            value={why}
            onChange={(e) => onWhy(e.target.value)}
            rows={2}
            aria-invalid={Boolean(error)}
            className="rounded-lg border-2 border-steel-700 p-2 text-lg font-normal aria-[invalid=true]:border-fail"
          />
        </label>
      )}
      {error && (
        <p className="mt-1 font-bold text-fail" data-testid={errorTestId}>
          ✖ {error}
        </p>
      )}
    </li>
  );
}
