/**
 * Power per unit of boost: peak corrected power divided by the boost target (gauge pressure), and
 * the extra power each extra unit of boost bought between two runs. A naturally aspirated run
 * (boost 0) has no figure (null), rather than infinity.
 */
import { convertPower, convertPressure, type PowerUnit, type PressureUnit } from "@/lib/calc";
import { requireFinite, requireNonNegative } from "@/lib/calc/errors";

/** Power (in `powerUnit`) per one `boostUnit` of boost; null when the boost is 0. */
export function powerPerBoost(
  powerKw: number,
  boost: { value: number; unit: PressureUnit },
  powerUnit: PowerUnit = "kW",
  perUnit: PressureUnit = boost.unit,
): number | null {
  requireFinite("powerKw", powerKw);
  requireNonNegative("boost.value", boost.value);
  const b = convertPressure(boost.value, boost.unit, perUnit);
  if (b === 0) return null;
  return convertPower(powerKw, "kW", powerUnit) / b;
}

/**
 * (P₂ − P₁) / (b₂ − b₁): the power each extra unit of boost bought between run 1 and run 2;
 * null when both runs had the same boost.
 */
export function powerGainPerBoost(
  run1: { powerKw: number; boost: { value: number; unit: PressureUnit } },
  run2: { powerKw: number; boost: { value: number; unit: PressureUnit } },
  powerUnit: PowerUnit = "kW",
  perUnit: PressureUnit = "kPa",
): number | null {
  const b1 = convertPressure(requireNonNegative("run1.boost.value", run1.boost.value), run1.boost.unit, perUnit);
  const b2 = convertPressure(requireNonNegative("run2.boost.value", run2.boost.value), run2.boost.unit, perUnit);
  if (b1 === b2) return null;
  const dp = convertPower(requireFinite("run2.powerKw", run2.powerKw) - requireFinite("run1.powerKw", run1.powerKw), "kW", powerUnit);
  return dp / (b2 - b1);
}
