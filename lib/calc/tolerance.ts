/**
 * Checks a measured length against a spec (nominal with min/max limits) in any length unit, or a
 * measured volume (cc) against a spec in cc.
 */
import { CalcInputError, requireFinite, requireObject, requireOneOf } from "./errors";
import { convertLength, isLengthUnit, MEASUREMENT_UNITS, sameMeasurementKind, type LengthUnit, type MeasurementUnit } from "./units";

/** A reading with its unit. */
export interface MeasuredLength {
  value: number;
  unit: MeasurementUnit;
}

/**
 * A length spec. `min` and `max` are absolute limits (not ± offsets) in `unit`; give at least one.
 * `nominal` defaults to the midpoint when both limits are given and is required otherwise.
 * Must satisfy min ≤ nominal ≤ max.
 */
export interface ToleranceSpec {
  unit: MeasurementUnit;
  nominal?: number;
  min?: number;
  max?: number;
}

export type ToleranceStatus = "in" | "low" | "high";

export interface ToleranceResult {
  /** "low" below min, "high" above max, otherwise "in" (a value equal to a limit is in). */
  status: ToleranceStatus;
  /** valueInSpecUnit − nominal, in the spec's unit, not rounded. */
  deviation: number;
  /** The reading converted to the spec's unit. */
  valueInSpecUnit: number;
  /** The nominal used for the deviation (given, or the midpoint of min and max). */
  nominal: number;
}

/** A decimal number m × 10^e with an integer mantissa. */
interface Decimal {
  m: bigint;
  e: number;
}

/** Each length unit's size in mm as an exact decimal: 1 mm, 1 in = 254 × 10⁻¹ mm, 1 µm = 1 × 10⁻³ mm. */
const UNIT_IN_MM: Record<LengthUnit, Decimal> = {
  mm: { m: 1n, e: 0 },
  in: { m: 254n, e: -1 },
  µm: { m: 1n, e: -3 },
};

/** The shortest decimal that reads back as `x` (JavaScript's own number-to-string), as m × 10^e. */
function toDecimal(x: number): Decimal {
  const match = /^(-?)(\d+)(?:\.(\d+))?(?:e([+-]\d+))?$/.exec(String(x));
  if (!match) throw new CalcInputError("value", x, "must be a finite number");
  const [, sign, whole, fraction = "", exponent = "0"] = match;
  const mantissa = BigInt(whole + fraction);
  return { m: sign ? -mantissa : mantissa, e: Number(exponent) - fraction.length };
}

function lengthInMm(x: number, unit: LengthUnit): Decimal {
  const d = toDecimal(x);
  const u = UNIT_IN_MM[unit];
  return { m: d.m * u.m, e: d.e + u.e };
}

/** Exact comparison of two decimals: −1, 0 or 1. */
function compareDecimal(a: Decimal, b: Decimal): number {
  const e = Math.min(a.e, b.e);
  const am = a.m * 10n ** BigInt(a.e - e);
  const bm = b.m * 10n ** BigInt(b.e - e);
  return am < bm ? -1 : am > bm ? 1 : 0;
}

/**
 * Compares `value` (in `valueUnit`) with `limit` (in `limitUnit`) exactly: both numbers are taken as
 * the decimals they print as, and inch/mm/µm ratios are exact, so a reading of 0.001 in equals a
 * limit of 0.0254 mm (no floating-point rounding decides a boundary).
 */
function compareLengths(value: number, valueUnit: MeasurementUnit, limit: number, limitUnit: MeasurementUnit): number {
  if (valueUnit === limitUnit) return value < limit ? -1 : value > limit ? 1 : 0;
  if (!isLengthUnit(valueUnit) || !isLengthUnit(limitUnit)) {
    throw new CalcInputError("measured.unit", valueUnit, `cannot be compared with ${limitUnit}`);
  }
  // Fast path: the floating-point conversion is off by a few parts in 10¹⁶ at most, so when the
  // converted value and the limit differ by more than 1 part in 10¹², the plain comparison is exact.
  const converted = convertLength(value, valueUnit, limitUnit);
  if (Math.abs(converted - limit) > 1e-12 * Math.max(Math.abs(converted), Math.abs(limit))) {
    return converted < limit ? -1 : 1;
  }
  return compareDecimal(lengthInMm(value, valueUnit), lengthInMm(limit, limitUnit));
}

/**
 * Evaluates a length reading against a spec.
 *
 * `measured` is `{ value, unit }` or a bare number taken to be in the spec's unit.
 * status: "low" if value < min, "high" if value > max, else "in" — boundary values are in.
 * The comparison is exact in decimal (see above); nothing is rounded.
 * deviation = value converted to the spec's unit − nominal (spec's unit).
 */
export function evaluateTolerance(measured: MeasuredLength | number, spec: ToleranceSpec): ToleranceResult {
  requireObject("spec", spec);
  const specUnit = requireOneOf("spec.unit", spec.unit, MEASUREMENT_UNITS);
  let value: number;
  let valueUnit: MeasurementUnit;
  if (typeof measured === "number") {
    value = requireFinite("measured", measured);
    valueUnit = specUnit;
  } else {
    requireObject("measured", measured);
    value = requireFinite("measured.value", measured.value);
    valueUnit = requireOneOf("measured.unit", measured.unit, MEASUREMENT_UNITS);
    if (!sameMeasurementKind(valueUnit, specUnit)) {
      throw new CalcInputError("measured.unit", valueUnit, `must be a unit of the same kind as the spec's ${specUnit}`);
    }
  }

  const min = spec.min === undefined ? undefined : requireFinite("spec.min", spec.min);
  const max = spec.max === undefined ? undefined : requireFinite("spec.max", spec.max);
  if (min === undefined && max === undefined) {
    throw new CalcInputError("spec", spec, "must give min, max or both");
  }
  if (min !== undefined && max !== undefined && min > max) {
    throw new CalcInputError("spec.min", min, `must not exceed spec.max (${max})`);
  }
  let nominal: number;
  if (spec.nominal === undefined) {
    if (min === undefined || max === undefined) {
      throw new CalcInputError("spec.nominal", spec.nominal, "is required when only one limit is given");
    }
    nominal = (min + max) / 2;
  } else {
    nominal = requireFinite("spec.nominal", spec.nominal);
    if ((min !== undefined && nominal < min) || (max !== undefined && nominal > max)) {
      throw new CalcInputError("spec.nominal", nominal, `must lie within the limits (${min ?? "−∞"} … ${max ?? "+∞"})`);
    }
  }

  let status: ToleranceStatus = "in";
  if (min !== undefined && compareLengths(value, valueUnit, min, specUnit) < 0) status = "low";
  else if (max !== undefined && compareLengths(value, valueUnit, max, specUnit) > 0) status = "high";

  const valueInSpecUnit = isLengthUnit(valueUnit) && isLengthUnit(specUnit) ? convertLength(value, valueUnit, specUnit) : value;
  return { status, deviation: valueInSpecUnit - nominal, valueInSpecUnit, nominal };
}
