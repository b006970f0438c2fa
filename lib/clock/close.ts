/**
 * A supervisor closes a clock left running: when it is taken to have ended, and why. Pure checks;
 * db/bench/clocks.ts writes the closing record (append-only) after them.
 */
import { z } from "zod";
import { saneInstant, safeText } from "@/lib/safe-values";
import { formatMinutes, spanMinutes } from "./hours";
import type { ClockSpan } from "./spans";

export const clockCloseSchema = z
  .object({
    endedAt: saneInstant("Ended at"),
    reason: safeText({
      label: "Reason",
      min: 3,
      max: 500,
      multiline: true,
      tooShort: "Reason: say in a few words why the clock is closed",
    }),
  })
  .strict();
export type ClockCloseInput = z.input<typeof clockCloseSchema>;

/** A close more than this ahead of the server's clock is refused (a clock cannot end in the future). */
const AHEAD_MS = 5 * 60_000;

const utc = (ms: number) => `${new Date(ms).toISOString().slice(0, 16).replace("T", " ")} UTC`;

/** Why this close cannot be recorded (with what to do), or null. `span` is the clock as it stands now. */
export function closeRefusal(span: ClockSpan, endedAtMs: number, nowMs: number): string | null {
  if (!span.running) {
    return `This clock already ended at ${utc(span.endedAtMs)} (${span.endedBy === "next-clock-on" ? "the mechanic clocked on elsewhere" : span.endedBy === "clocked-off" ? "clocked off" : "closed by a supervisor"}); nothing to close.`;
  }
  if (endedAtMs < span.startedAtMs) {
    return `Ended at: ${utc(endedAtMs)} is before the clock-on at ${utc(span.startedAtMs)}; a clock cannot end before it starts.`;
  }
  if (endedAtMs > nowMs + AHEAD_MS) return `Ended at: ${utc(endedAtMs)} is in the future; give the time the work stopped.`;
  return null;
}

/** What the close makes of the clock, for the confirmation. */
export function closedLength(span: ClockSpan, endedAtMs: number): string {
  return formatMinutes(spanMinutes({ startedAtMs: span.startedAtMs, endedAtMs }));
}
