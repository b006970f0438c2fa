/**
 * The boost target of a dyno run, checked per unit: the physical range is one range in kPa gauge
 * (lib/calc INPUT_RULES.boost, 0 to 600 kPa), so 10 psi typed as 68.9 kPa is as good as 10 psi and
 * 59 bar is refused whatever it is typed in. The message names what was typed and what it is:
 * "Boost target 59 bar is 5 900 kPa; the limit is 0 to 600 kPa (87 psi, 6 bar)."
 */
import { convertPressure, formatNumber, INPUT_RULES, withUnit } from "@/lib/calc";

export const BOOST_UNITS = ["psi", "kPa", "bar"] as const;
export type BoostUnit = (typeof BOOST_UNITS)[number];

const round = (x: number, digits: number) => Number(x.toFixed(digits));

/** "0 to 600 kPa (87 psi, 6 bar)": the boost limit in every unit the form offers. */
export function boostLimitWords(): string {
  const { min, max } = INPUT_RULES.boost;
  return `${formatNumber(min)} to ${withUnit(max, "kPa")} (${withUnit(round(convertPressure(max, "kPa", "psi"), 0), "psi")}, ${withUnit(round(convertPressure(max, "kPa", "bar"), 2), "bar")})`;
}

/** Boost target in kPa gauge. */
export function boostTargetKpa(value: number, unit: BoostUnit): number {
  return convertPressure(value, unit, "kPa");
}

/** Why a boost target cannot be, in workshop words, or null when it is inside the range. */
export function boostTargetProblem(value: number, unit: BoostUnit): string | null {
  if (!Number.isFinite(value)) return "Boost target must be a number.";
  const kpa = boostTargetKpa(value, unit);
  const { min, max } = INPUT_RULES.boost;
  if (kpa >= min && kpa <= max) return null;
  if (unit === "kPa") return `Boost target must be ${boostLimitWords()} above the air pressure; got ${withUnit(value, "kPa")}.`;
  return `Boost target ${withUnit(value, unit)} is ${withUnit(round(kpa, 1), "kPa")}; the limit is ${boostLimitWords()}.`;
}
