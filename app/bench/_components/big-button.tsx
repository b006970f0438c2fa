"use client";

import type { ButtonHTMLAttributes, MouseEvent, ReactNode } from "react";
import { useTapGuard } from "./use-tap-guard";

type Tone = "primary" | "plain" | "danger" | "go";

const TONES: Record<Tone, string> = {
  primary: "bg-steel-900 text-white border-steel-900",
  go: "bg-pass text-white border-pass",
  danger: "bg-fail text-white border-fail",
  plain: "bg-white text-ink border-steel-700",
};

/**
 * A bench button: at least 64 px tall, bold, high contrast. One that `records` something takes one
 * tap per deliberate press (`lib/bench/tap-guard.ts`, as the torque button does): a second tap
 * while the first one's save is still being written, or within a short window after it (a double
 * tap, a glove's bounce), is ignored, and the button rests (disabled) meanwhile.
 */
export function BigButton({
  tone = "primary",
  className = "",
  children,
  records = false,
  onClick,
  disabled,
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement> & {
  tone?: Tone;
  children: ReactNode;
  /** The click records work: guard it against double taps (its handler may return the save's promise). */
  records?: boolean;
  onClick?: (e: MouseEvent<HTMLButtonElement>) => unknown;
}) {
  const { resting, tap } = useTapGuard();

  return (
    <button
      type="button"
      {...rest}
      disabled={disabled || (records && resting)}
      aria-busy={records ? resting : undefined}
      onClick={records ? (e) => void tap(() => onClick?.(e)) : onClick}
      className={`min-h-target min-w-target rounded-xl border-4 px-5 text-xl font-bold disabled:cursor-not-allowed disabled:border-steel-300 disabled:bg-steel-100 disabled:text-steel-700 ${TONES[tone]} ${className}`}
    >
      {children}
    </button>
  );
}
