/**
 * Comparing two runs: both curves read on a common rpm grid (linear interpolation between recorded
 * points, never beyond either run's range), the difference at each grid speed, and the peak deltas.
 */
import { CalcInputError } from "@/lib/calc";
import { requirePositive } from "@/lib/calc/errors";
import type { Peak, RunCurve } from "./run-curve";
import type { DynoRunSummary } from "./run-summary";

/**
 * Linear interpolation of `value` at `rpm` over points in rising rpm order; null outside the range.
 */
export function interpolateAt<T extends { rpm: number }>(points: readonly T[], rpm: number, value: (p: T) => number): number | null {
  if (points.length === 0 || rpm < points[0].rpm || rpm > points[points.length - 1].rpm) return null;
  const hi = points.findIndex((p) => p.rpm >= rpm);
  if (points[hi].rpm === rpm) return value(points[hi]);
  const a = points[hi - 1];
  const b = points[hi];
  const t = (rpm - a.rpm) / (b.rpm - a.rpm);
  return value(a) + t * (value(b) - value(a));
}

/**
 * The multiples of `step` rpm that lie inside both ranges [aMin, aMax] and [bMin, bMax];
 * empty when the ranges do not overlap.
 */
export function commonRpmGrid(a: readonly [number, number], b: readonly [number, number], step: number): number[] {
  requirePositive("step", step);
  const lo = Math.ceil(Math.max(a[0], b[0]) / step) * step;
  const hi = Math.floor(Math.min(a[1], b[1]) / step) * step;
  const grid: number[] = [];
  for (let rpm = lo; rpm <= hi; rpm += step) grid.push(rpm);
  return grid;
}

interface DeltaPoint {
  rpm: number;
  basePowerKw: number;
  otherPowerKw: number;
  deltaPowerKw: number;
  baseTorqueNm: number;
  otherTorqueNm: number;
  deltaTorqueNm: number;
}

interface RunComparison {
  grid: DeltaPoint[];
  /** Peak corrected power and torque of the other run minus the base run's (and in % of base). */
  peakDelta: { powerKw: number; powerPercent: number; torqueNm: number; torquePercent: number };
  /** Where on the grid the other run gains most / loses most power (null if the grid is empty). */
  largestGain: Peak | null;
  largestLoss: Peak | null;
}

/** Compares `other` against `base` on corrected values; `step` is the grid spacing in rpm (default 250). */
export function compareRuns(base: RunCurve, other: RunCurve, step = 250): RunComparison {
  const range = (c: RunCurve) => [c.points[0].rpm, c.points[c.points.length - 1].rpm] as const;
  if (base.points.length === 0 || other.points.length === 0) {
    throw new CalcInputError("runs", null, "must both hold points");
  }
  const grid = commonRpmGrid(range(base), range(other), step).map((rpm) => {
    const basePowerKw = interpolateAt(base.points, rpm, (p) => p.correctedPowerKw)!;
    const otherPowerKw = interpolateAt(other.points, rpm, (p) => p.correctedPowerKw)!;
    const baseTorqueNm = interpolateAt(base.points, rpm, (p) => p.correctedTorqueNm)!;
    const otherTorqueNm = interpolateAt(other.points, rpm, (p) => p.correctedTorqueNm)!;
    return {
      rpm,
      basePowerKw,
      otherPowerKw,
      deltaPowerKw: otherPowerKw - basePowerKw,
      baseTorqueNm,
      otherTorqueNm,
      deltaTorqueNm: otherTorqueNm - baseTorqueNm,
    };
  });
  const bp = base.peaks.correctedPowerKw.value;
  const bt = base.peaks.correctedTorqueNm.value;
  const powerKw = other.peaks.correctedPowerKw.value - bp;
  const torqueNm = other.peaks.correctedTorqueNm.value - bt;
  let largestGain: Peak | null = null;
  let largestLoss: Peak | null = null;
  for (const g of grid) {
    if (!largestGain || g.deltaPowerKw > largestGain.value) largestGain = { value: g.deltaPowerKw, rpm: g.rpm };
    if (!largestLoss || g.deltaPowerKw < largestLoss.value) largestLoss = { value: g.deltaPowerKw, rpm: g.rpm };
  }
  return {
    grid,
    peakDelta: { powerKw, powerPercent: (powerKw / bp) * 100, torqueNm, torquePercent: (torqueNm / bt) * 100 },
    largestGain,
    largestLoss,
  };
}

/** One engine speed of a comparison: power and torque of each run there, and boost beside them. */
export interface SameRpmRow extends DeltaPoint {
  /** Logged manifold boost of each run at this speed, kPa gauge; null where a run has none logged there. */
  baseBoostKpa: number | null;
  otherBoostKpa: number | null;
  /** other − base, kPa; null unless both runs logged boost at this speed. */
  deltaBoostKpa: number | null;
}

export interface RunDifference extends Omit<RunComparison, "grid"> {
  rows: SameRpmRow[];
  /** Boost target of the other run minus the base run's, kPa. */
  deltaBoostTargetKpa: number;
  /** Both runs corrected to this standard (their own standards may differ). */
  correctedTo: DynoRunSummary["correctedTo"];
}

/**
 * Two runs compared honestly: both must be corrected to the same standard (summarise them with one
 * chosen standard first); power and torque are compared at the same engine speeds (every `step` rpm
 * inside both runs' ranges, read between recorded points), and the boost difference is given beside
 * the power difference at each of those speeds (logged boost where both runs have it) and for the
 * targets. No "power per unit of boost" figure: power does not scale with boost alone.
 */
export function compareAtSameRpm(base: DynoRunSummary, other: DynoRunSummary, step = 250): RunDifference {
  if (base.correctedTo !== other.correctedTo) {
    throw new CalcInputError("runs", [base.correctedTo, other.correctedTo], "must be corrected to one standard before they are compared");
  }
  const { grid, ...rest } = compareRuns(base.curve, other.curve, step);
  const boostAt = (s: DynoRunSummary, rpm: number) => {
    const line = s.series.boost;
    return line && line.length ? interpolateAt(line, rpm, (p) => p.value) : null;
  };
  const rows = grid.map((g) => {
    const baseBoostKpa = boostAt(base, g.rpm);
    const otherBoostKpa = boostAt(other, g.rpm);
    return {
      ...g,
      baseBoostKpa,
      otherBoostKpa,
      deltaBoostKpa: baseBoostKpa === null || otherBoostKpa === null ? null : otherBoostKpa - baseBoostKpa,
    };
  });
  return { ...rest, rows, deltaBoostTargetKpa: other.boostTargetKpa - base.boostTargetKpa, correctedTo: base.correctedTo };
}
