/**
 * Rule-of-thumb piston-ring end gaps. Common practice only, never a substitute for the ring
 * maker's figure for the exact ring set, bore and use.
 */
import { requireOneOf, requirePositive } from "./errors";

export const RING_GAP_DUTIES = ["naturally-aspirated", "boosted"] as const;
export type RingGapDuty = (typeof RING_GAP_DUTIES)[number];

/**
 * Top-ring gap factors (gap = factor × bore, dimensionless, e.g. inches of gap per inch of bore).
 * Common practice, no single source: street/naturally aspirated about 0.0045–0.0050;
 * boosted from about 0.0050 (moderate boost) to 0.0065 (heavy boost).
 */
export const TOP_RING_GAP_FACTORS: Readonly<Record<RingGapDuty, { min: number; max: number }>> = {
  "naturally-aspirated": { min: 0.0045, max: 0.005 },
  boosted: { min: 0.005, max: 0.0065 },
};

/** Second-ring gap as a multiple of the top-ring gap (common practice: about 1.25 ×). */
export const SECOND_RING_GAP_RATIO = 1.25;

export interface RingGapGuide {
  duty: RingGapDuty;
  boreMm: number;
  /** Top-ring end gap range in mm = factor × bore. */
  topRing: { minMm: number; maxMm: number; factorMin: number; factorMax: number };
  /** Second-ring end gap range in mm = 1.25 × the top-ring range. */
  secondRing: { minMm: number; maxMm: number };
  /** Where the numbers come from. */
  basis: string;
  /** Always shown beside the figures. */
  caution: string;
}

/**
 * Rule-of-thumb end-gap range for `boreMm` (> 0) and `duty`:
 *   top ring = factor × bore (naturally aspirated 0.0045–0.0050, boosted 0.0050–0.0065),
 *   second ring = 1.25 × top ring. Common practice, not a specification.
 */
export function ringGapGuide(boreMm: number, duty: RingGapDuty): RingGapGuide {
  requirePositive("boreMm", boreMm);
  const d = requireOneOf("duty", duty, RING_GAP_DUTIES);
  const f = TOP_RING_GAP_FACTORS[d];
  const topMin = f.min * boreMm;
  const topMax = f.max * boreMm;
  return {
    duty: d,
    boreMm,
    topRing: { minMm: topMin, maxMm: topMax, factorMin: f.min, factorMax: f.max },
    secondRing: { minMm: SECOND_RING_GAP_RATIO * topMin, maxMm: SECOND_RING_GAP_RATIO * topMax },
    basis: "Common practice: end gap as a fraction of bore, wider for boost; second ring about 1.25 × the top ring.",
    caution: "A rule of thumb only. Use the ring maker's end-gap figure for this ring set, bore and use; it always takes precedence.",
  };
}
