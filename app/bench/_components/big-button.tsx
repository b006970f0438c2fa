"use client";

import type { ButtonHTMLAttributes, ReactNode } from "react";

type Tone = "primary" | "plain" | "danger" | "go";

const TONES: Record<Tone, string> = {
  primary: "bg-steel-900 text-white border-steel-900",
  go: "bg-pass text-white border-pass",
  danger: "bg-fail text-white border-fail",
  plain: "bg-white text-ink border-steel-700",
};

/** A bench button: at least 64 px tall, bold, high contrast. */
export function BigButton({
  tone = "primary",
  className = "",
  children,
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: Tone; children: ReactNode }) {
  return (
    <button
      type="button"
      {...rest}
      className={`min-h-target min-w-target rounded-xl border-4 px-5 text-xl font-bold disabled:cursor-not-allowed disabled:border-steel-300 disabled:bg-steel-100 disabled:text-steel-700 ${TONES[tone]} ${className}`}
    >
      {children}
    </button>
  );
}
