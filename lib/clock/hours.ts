/**
 * Hours from clock spans, per stage and per person, against the quoted labour.
 *
 * Rounding, stated once: each span counts in whole minutes, rounded to the nearest minute (30 s and
 * more round up); every total is the sum of its spans' minutes, so the stage totals and the person
 * totals each add up to the job's total exactly. Hours are shown as hours and minutes ("3 h 05 min")
 * and, beside the quote, as decimal hours to two places (minutes ÷ 60, half up), the unit the quote's
 * labour quantity is kept in (hundredths of an hour: lib/office/schemas.ts).
 */
import type { ClockSpan } from "./spans";

const MINUTE_MS = 60_000;

/** A span's length in whole minutes (nearest minute, half up; never below 0). */
export function spanMinutes(span: { startedAtMs: number; endedAtMs: number }): number {
  const ms = Math.max(0, span.endedAtMs - span.startedAtMs);
  return Math.floor((ms + MINUTE_MS / 2) / MINUTE_MS);
}

/** Minutes as hundredths of an hour (the quote's labour unit), half up: 20 min → 33, 1 min → 2. */
export function minutesToHundredths(minutes: number): number {
  return Math.floor((minutes * 100 + 30) / 60);
}

/** Hundredths of an hour as minutes, half up: 1400 (14.00 h) → 840. */
export function hundredthsToMinutes(hundredths: number): number {
  return Math.floor((hundredths * 60 + 50) / 100);
}

/** "3 h 05 min", "45 min", "0 min". */
export function formatMinutes(minutes: number): string {
  const m = Math.max(0, Math.round(minutes));
  const h = Math.floor(m / 60);
  const rest = m % 60;
  if (h === 0) return `${rest} min`;
  return `${h} h ${String(rest).padStart(2, "0")} min`;
}

/** "14.00 h" from hundredths of an hour. */
export function formatHundredthsAsHours(hundredths: number): string {
  const sign = hundredths < 0 ? "−" : "";
  const abs = Math.abs(hundredths);
  return `${sign}${Math.floor(abs / 100)}.${String(abs % 100).padStart(2, "0")} h`;
}

export interface StageRef {
  jobProcedureId: string;
  stageKey: string;
}

export interface HoursLine {
  /** Stage key `${jobProcedureId}|${stageKey}`, a person's id, or "" for clocks naming no stage. */
  key: string;
  minutes: number;
  /** Still counting (a clock of it is running). */
  running: boolean;
}

export interface HoursSummary {
  totalMinutes: number;
  running: boolean;
  byStage: HoursLine[];
  byPerson: HoursLine[];
  /** The quoted labour, hundredths of an hour (null: no quote to compare with). */
  quotedHundredths: number | null;
  /** Clocked minus quoted, hundredths of an hour (null without a quote): above 0 is over the quote. */
  overQuoteHundredths: number | null;
}

export const stageKeyOf = (s: { jobProcedureId: string | null; stageKey: string | null }) =>
  s.jobProcedureId && s.stageKey ? `${s.jobProcedureId}|${s.stageKey}` : "";

function group(spans: readonly ClockSpan[], keyOf: (s: ClockSpan) => string): HoursLine[] {
  const out = new Map<string, HoursLine>();
  for (const s of spans) {
    const key = keyOf(s);
    const line = out.get(key) ?? { key, minutes: 0, running: false };
    line.minutes += spanMinutes(s);
    line.running ||= s.running;
    out.set(key, line);
  }
  return [...out.values()];
}

/** The hours on one job from its spans, per stage and per person, and against the quoted labour. */
export function summariseHours(spans: readonly ClockSpan[], quotedHundredths: number | null): HoursSummary {
  const totalMinutes = spans.reduce((sum, s) => sum + spanMinutes(s), 0);
  const clocked = minutesToHundredths(totalMinutes);
  return {
    totalMinutes,
    running: spans.some((s) => s.running),
    byStage: group(spans, stageKeyOf),
    byPerson: group(spans, (s) => s.mechanicId),
    quotedHundredths,
    overQuoteHundredths: quotedHundredths === null ? null : clocked - quotedHundredths,
  };
}

/** The labour of a quote: the sum of its labour lines' quantities (hundredths of an hour). */
export function quotedLabourHundredths(lines: ReadonlyArray<{ kind: string; quantityHundredths: number }>): number {
  return lines.filter((l) => l.kind === "labour").reduce((sum, l) => sum + l.quantityHundredths, 0);
}
