/**
 * Points of a pull worth a second look, marked on the plot: a lean point (lambda above the limit
 * while on boost) and an over-boost point (manifold boost above the run's target by more than the
 * margin). The limits are the tuner's: the defaults are common practice for a boosted petrol engine
 * at full load (no source; the engine's own tune and the fuel decide).
 */
import { convertPressure, formatNumber, FUELS, withUnit } from "@/lib/calc";
import type { DynoRunSummary } from "./run-summary";

export interface MarkLimits {
  /** A point is lean above this lambda (while on boost, where boost is logged). */
  leanAboveLambda: number;
  /** A point is over-boost when boost exceeds the run's target by more than this, kPa. */
  overBoostMarginKpa: number;
}

/** Common practice, no source: richer than λ 0.85 under boost on petrol; 7 kPa ≈ 1 psi over target. */
export const DEFAULT_MARK_LIMITS: Readonly<MarkLimits> = Object.freeze({ leanAboveLambda: 0.85, overBoostMarginKpa: 7 });

export interface MarkInputPoint {
  rpm: number;
  /** Lambda at this point, or null where not logged. */
  lambda: number | null;
  /** Manifold boost, kPa gauge, or null where not logged. */
  boostKpa: number | null;
}

export interface PointMark {
  kind: "lean" | "over-boost";
  rpm: number;
  /** λ for a lean mark, kPa gauge for an over-boost mark. */
  value: number;
  /** The limit it crossed, in the same unit. */
  limit: number;
  message: string;
}

const r2 = (x: number) => formatNumber(Number(x.toFixed(2)));
const r1 = (x: number) => formatNumber(Number(x.toFixed(1)));

/**
 * The lean and over-boost points of one run, in rising rpm. A lean point needs λ above the limit
 * and, where boost is logged at that point, boost above 0 (on boost); without a boost reading the
 * point counts as on boost (a full-load pull). Exactly at a limit is not marked.
 * @param stoichiometricAfr the fuel's ratio, to give the air-fuel ratio beside lambda (null: lambda only).
 */
export function markPoints(
  points: readonly MarkInputPoint[],
  run: { boostTargetKpa: number; stoichiometricAfr: number | null },
  limits: MarkLimits = DEFAULT_MARK_LIMITS,
): PointMark[] {
  const marks: PointMark[] = [];
  const boostLimit = run.boostTargetKpa + limits.overBoostMarginKpa;
  for (const p of points) {
    const onBoost = p.boostKpa === null || p.boostKpa > 0;
    if (p.lambda !== null && onBoost && p.lambda > limits.leanAboveLambda) {
      const afr = run.stoichiometricAfr === null ? "" : ` (AFR ${r1(p.lambda * run.stoichiometricAfr)})`;
      marks.push({
        kind: "lean",
        rpm: p.rpm,
        value: p.lambda,
        limit: limits.leanAboveLambda,
        message: `Lean at ${withUnit(p.rpm, "rpm")}: λ ${r2(p.lambda)}${afr}, leaner than the λ ${r2(limits.leanAboveLambda)} limit.`,
      });
    }
    if (p.boostKpa !== null && p.boostKpa > boostLimit) {
      marks.push({
        kind: "over-boost",
        rpm: p.rpm,
        value: p.boostKpa,
        limit: boostLimit,
        message: `Over-boost at ${withUnit(p.rpm, "rpm")}: ${withUnit(Number(p.boostKpa.toFixed(1)), "kPa")} (${r1(convertPressure(p.boostKpa, "kPa", "psi"))} psi), ${withUnit(Number((p.boostKpa - run.boostTargetKpa).toFixed(1)), "kPa")} over the ${withUnit(Number(run.boostTargetKpa.toFixed(1)), "kPa")} target.`,
      });
    }
  }
  return marks;
}

/** The marks of a summarised run, from its logged mixture and boost (none when neither is logged). */
export function marksOfRun(
  run: Pick<DynoRunSummary, "points" | "series" | "boostTargetKpa" | "fuel">,
  limits: MarkLimits = DEFAULT_MARK_LIMITS,
): PointMark[] {
  const mixture = new Map((run.series.mixture ?? []).map((p) => [p.rpm, p.value]));
  const boost = new Map((run.series.boost ?? []).map((p) => [p.rpm, p.value]));
  if (mixture.size === 0 && boost.size === 0) return [];
  return markPoints(
    run.points.map((p) => ({ rpm: p.rpm, lambda: mixture.get(p.rpm) ?? null, boostKpa: boost.get(p.rpm) ?? null })),
    { boostTargetKpa: run.boostTargetKpa, stoichiometricAfr: run.fuel === null ? null : FUELS[run.fuel].stoichiometricAfr },
    limits,
  );
}
