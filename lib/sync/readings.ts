/**
 * Readings (measurements) are append-only. A correction is a new reading naming the one it
 * supersedes; both stay on record. Two tablets reading the same spot offline both keep theirs.
 *
 * The current reading for a spot (job, spec, reading index) is the one with the latest stamp among
 * those no other reading supersedes. The database view `current_measurements` states the same rule.
 */
import { evaluateTolerance, type ToleranceStatus } from "@/lib/calc/tolerance";
import type { MeasurementUnit } from "@/lib/calc/units";
import { compareStamps } from "./hlc";

/** A reading's verdict against its spec, as stored and sent: within the limits, below, above. */
export const VERDICTS = ["in", "low", "high"] as const satisfies readonly ToleranceStatus[];
export type Verdict = (typeof VERDICTS)[number];

interface ReadingLike {
  id: string;
  workOrderId?: string;
  specId: string;
  readingIndex: number;
  stamp: string;
  supersedesId: string | null;
}

/** The current reading of every spot, in input order of first appearance of the spot. */
export function currentReadings<T extends ReadingLike>(readings: readonly T[]): T[] {
  const superseded = new Set(readings.map((r) => r.supersedesId).filter((id): id is string => id !== null));
  const best = new Map<string, T>();
  for (const r of readings) {
    if (superseded.has(r.id)) continue;
    const spot = `${r.workOrderId ?? ""}|${r.specId}|${r.readingIndex}`;
    const held = best.get(spot);
    if (!held || isLater(r, held)) best.set(spot, r);
  }
  return [...best.values()];
}

function isLater(a: ReadingLike, b: ReadingLike): boolean {
  const byStamp = compareStamps(a.stamp, b.stamp);
  return byStamp !== 0 ? byStamp > 0 : a.id > b.id;
}

export interface ReadingSpec {
  unit: MeasurementUnit;
  min: number;
  max: number;
  nominal: number | null;
}

/**
 * "low" below min, "high" above max, else "in" (limits are in); exact across mm/in/µm. A value
 * given as its decimal text (./reading-value.ts: at most 15 significant digits) converts to the
 * number that prints as the same decimal, so the comparison sees exactly what was typed.
 */
export function readingVerdict(value: string | number, unit: MeasurementUnit, spec: ReadingSpec): ToleranceStatus {
  return evaluateTolerance(
    { value: Number(value), unit },
    { unit: spec.unit, min: spec.min, max: spec.max, ...(spec.nominal === null ? {} : { nominal: spec.nominal }) },
  ).status;
}
