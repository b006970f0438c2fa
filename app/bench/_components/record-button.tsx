"use client";

import { useRef, type ReactNode } from "react";
import { useTapGuard } from "./use-tap-guard";

/**
 * A button that records exactly what it showed when the finger went down. The target is fixed on
 * pointer-down and that fixed target is recorded at release, even if the screen moved on in
 * between (another tablet's work arriving). A second tap within a short window, or while the
 * previous save is still being written, is ignored (`lib/bench/tap-guard.ts`); the button rests
 * (disabled) for that window so the next tap is a deliberate one.
 */
export function RecordButton<T>({
  target,
  onRecord,
  disabled = false,
  className = "",
  testId,
  children,
}: {
  /** What a tap now would record; null when there is nothing to record. */
  target: T | null;
  onRecord: (target: T) => Promise<void>;
  disabled?: boolean;
  className?: string;
  testId?: string;
  children: ReactNode;
}) {
  const { resting, tap, ignoresTapAt } = useTapGuard();
  const fixed = useRef<T | null>(null);

  async function release() {
    // A keyboard press has no pointer-down: it records what is shown now.
    const chosen = fixed.current ?? target;
    fixed.current = null;
    if (chosen === null || disabled) return;
    await tap(() => onRecord(chosen));
  }

  return (
    <button
      type="button"
      data-testid={testId}
      disabled={disabled || target === null || resting}
      aria-busy={resting}
      onPointerDown={(e) => {
        if (e.isPrimary && !ignoresTapAt(performance.now())) fixed.current = target;
      }}
      onPointerCancel={() => (fixed.current = null)}
      onClick={() => void release()}
      className={`min-h-target min-w-target rounded-xl border-4 px-5 font-bold disabled:cursor-not-allowed ${className}`}
    >
      {children}
    </button>
  );
}
