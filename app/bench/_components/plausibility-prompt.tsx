"use client";

import { useEffect, useRef } from "react";
import { BigButton } from "./big-button";
import { useSettled } from "./reason-action";

/**
 * "Is that right?" before an unlikely value is saved: the reasons in plain words, and two large
 * buttons. The confirm rests for a moment after it appears, so the tap that asked cannot also
 * answer (a clear second tap, never a small checkbox). It scrolls itself to the middle of the
 * screen when it appears: under a keypad, its buttons would otherwise sit below the fold or behind
 * the step's torque bar.
 */
export function PlausibilityPrompt({
  reasons,
  value,
  onConfirm,
  onBack,
}: {
  reasons: readonly string[];
  /** The value with its unit, as it will be saved. */
  value: string;
  onConfirm: () => unknown;
  onBack: () => void;
}) {
  const settled = useSettled();
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    // A block body: the effect returns nothing (newer browsers' scrollIntoView returns a promise, which React would take for a clean-up).
    box.current?.scrollIntoView({ block: "center" });
  }, []);
  return (
    <div
      ref={box}
      role="alertdialog"
      aria-label="Check this value"
      className="flex flex-col gap-3 rounded-xl border-4 border-warn bg-warn-light p-4"
      data-testid="plausibility-prompt"
    >
      <p className="text-2xl font-bold text-warn">
        <span aria-hidden="true">⚠ </span>Check this value: {value}
      </p>
      <ul className="list-inside list-disc text-lg">
        {reasons.map((r) => (
          <li key={r}>{r}</li>
        ))}
      </ul>
      <div className="grid gap-4 sm:grid-cols-2">
        <BigButton tone="plain" onClick={onBack} className="min-h-20">
          No, type it again
        </BigButton>
        <BigButton tone="danger" records disabled={!settled} onClick={onConfirm} className="min-h-20">
          Yes, it is right: save {value}
        </BigButton>
      </div>
    </div>
  );
}
