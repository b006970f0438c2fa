import type { ToleranceStatus } from "@/lib/calc/tolerance";

const LOOK: Record<ToleranceStatus, { words: string; mark: string; cls: string }> = {
  in: { words: "In spec", mark: "✔", cls: "border-pass bg-pass-light text-pass" },
  low: { words: "Low — under minimum", mark: "▼", cls: "border-fail bg-fail-light text-fail" },
  high: { words: "High — over maximum", mark: "▲", cls: "border-fail bg-fail-light text-fail" },
};

/** A reading's verdict in colour, mark and words. */
export function Verdict({ status, compact = false }: { status: ToleranceStatus; compact?: boolean }) {
  const l = LOOK[status];
  return (
    <span
      data-verdict={status}
      className={`inline-flex items-center gap-2 rounded-lg border-2 px-2 font-bold ${compact ? "text-base" : "py-1 text-xl"} ${l.cls}`}
    >
      <span aria-hidden="true">{l.mark}</span>
      {l.words}
    </span>
  );
}
