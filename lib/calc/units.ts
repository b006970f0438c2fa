/**
 * Unit conversions for torque, pressure, power, length and temperature.
 *
 * Every constant is derived from exact definitions listed in NIST SP 811
 * (2008), Appendix B.8: 1 in = 0.0254 m, 1 ft = 0.3048 m,
 * 1 lb = 0.453 592 37 kg, standard gravity gₙ = 9.806 65 m/s².
 * Conversions multiply by the ratio of the two units' sizes; nothing is rounded.
 */
import { CalcInputError, requireFinite, requireOneOf } from "./errors";

// ---------------------------------------------------------------------------
// Exact base definitions (NIST SP 811, App. B.8)
// ---------------------------------------------------------------------------

/** Millimetres in one inch (exact: 1 in = 25.4 mm). */
export const MM_PER_INCH = 25.4;
/** Metres in one foot (exact). */
export const M_PER_FOOT = 0.3048;
/** Kilograms in one avoirdupois pound (exact). */
export const KG_PER_POUND = 0.45359237;
/** Standard acceleration of gravity gₙ in m/s² (exact, used to define kgf and lbf). */
export const STANDARD_GRAVITY_M_S2 = 9.80665;
/** Conventional density of mercury in kg/m³ used to define mmHg and inHg (NIST SP 811, B.8 footnote). */
export const MERCURY_CONVENTIONAL_DENSITY_KG_M3 = 13595.1;

/** 1 lbf in newtons = 0.453 592 37 kg × 9.806 65 m/s² = 4.448 221 615 260 5 N. */
export const N_PER_LBF = KG_PER_POUND * STANDARD_GRAVITY_M_S2;
/** 1 kgf in newtons = 9.806 65 N. */
export const N_PER_KGF = STANDARD_GRAVITY_M_S2;

/** 1 lbf·ft in N·m = 4.448 221 615 260 5 N × 0.3048 m ≈ 1.355 817 948 331 4. */
export const NM_PER_LBF_FT = N_PER_LBF * M_PER_FOOT;
/** 1 lbf·in in N·m = 4.448 221 615 260 5 N × 0.0254 m ≈ 0.112 984 829 027 6. */
export const NM_PER_LBF_IN = N_PER_LBF * (MM_PER_INCH / 1000);
/** 1 kgf·m in N·m = 9.806 65. */
export const NM_PER_KGF_M = N_PER_KGF;

/** 1 psi (lbf/in²) in kPa = 4.448 221 615 260 5 N / (0.0254 m)² / 1000 ≈ 6.894 757 293 168. */
export const KPA_PER_PSI = N_PER_LBF / ((MM_PER_INCH / 1000) * (MM_PER_INCH / 1000)) / 1000;
/**
 * 1 conventional inch of mercury in kPa = 13 595.1 kg/m³ × gₙ × 0.0254 m / 1000
 * ≈ 3.386 388 64 (NIST SP 811 lists 3.386 389 E+03 Pa).
 */
export const KPA_PER_INHG = (MERCURY_CONVENTIONAL_DENSITY_KG_M3 * STANDARD_GRAVITY_M_S2 * (MM_PER_INCH / 1000)) / 1000;

/** 1 mechanical horsepower (550 ft·lbf/s) in kW ≈ 0.745 699 871 582 27 (NIST SP 811: 7.456 999 E+02 W). */
export const KW_PER_HP = (550 * M_PER_FOOT * N_PER_LBF) / 1000;
/** 1 metric horsepower (PS, 75 kgf·m/s) in kW = 0.735 498 75 (NIST SP 811: 7.354 988 E+02 W). */
export const KW_PER_PS = (75 * N_PER_KGF) / 1000;

/** Sea-level pressure of the standard atmosphere, kPa (ISO 2533 / U.S. Standard Atmosphere 1976). */
export const STANDARD_ATMOSPHERE_KPA = 101.325;
/** Sea-level temperature of the standard atmosphere, K (ISO 2533). */
export const STANDARD_ATMOSPHERE_K = 288.15;

/** Offset between kelvin and degrees Celsius: T/K = t/°C + 273.15 (exact). */
export const KELVIN_AT_0_C = 273.15;

// ---------------------------------------------------------------------------
// Unit names
// ---------------------------------------------------------------------------

/** Torque units: newton metre, pound-force foot, pound-force inch, kilogram-force metre. */
export const TORQUE_UNITS = ["N·m", "lbf·ft", "lbf·in", "kgf·m"] as const;
export type TorqueUnit = (typeof TORQUE_UNITS)[number];

/** Pressure units: kilopascal, pound-force per square inch, bar, conventional inch of mercury, millibar. */
export const PRESSURE_UNITS = ["kPa", "psi", "bar", "inHg", "mbar"] as const;
export type PressureUnit = (typeof PRESSURE_UNITS)[number];

/** Power units: kilowatt, mechanical horsepower (550 ft·lbf/s), metric horsepower PS (75 kgf·m/s). */
export const POWER_UNITS = ["kW", "hp", "PS"] as const;
export type PowerUnit = (typeof POWER_UNITS)[number];

/** Length units: millimetre, inch, micrometre (U+00B5 micro sign). */
export const LENGTH_UNITS = ["mm", "in", "µm"] as const;
export type LengthUnit = (typeof LENGTH_UNITS)[number];

/** Volume unit of a reading: cubic centimetre (a combustion chamber cc'd with a burette). */
export const VOLUME_UNITS = ["cc"] as const;
export type VolumeUnit = (typeof VOLUME_UNITS)[number];

/**
 * Units a measurement spec and its readings may use: a length, or a volume. A reading is compared
 * only with a spec of the same kind (lengths convert among themselves; cc stays cc).
 */
export const MEASUREMENT_UNITS = [...LENGTH_UNITS, ...VOLUME_UNITS] as const;
export type MeasurementUnit = (typeof MEASUREMENT_UNITS)[number];

/** True when `unit` is a length unit (mm, in, µm). */
export function isLengthUnit(unit: string): unit is LengthUnit {
  return (LENGTH_UNITS as readonly string[]).includes(unit);
}

/** True when readings in `a` can be compared with a spec in `b`: both lengths, or the same unit. */
export function sameMeasurementKind(a: MeasurementUnit, b: MeasurementUnit): boolean {
  return a === b || (isLengthUnit(a) && isLengthUnit(b));
}

/** Temperature units: degrees Celsius, kelvin, degrees Fahrenheit. */
export const TEMPERATURE_UNITS = ["C", "K", "F"] as const;
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];

/** Size of each torque unit in N·m. */
const TORQUE_IN_NM: Record<TorqueUnit, number> = {
  "N·m": 1,
  "lbf·ft": NM_PER_LBF_FT,
  "lbf·in": NM_PER_LBF_IN,
  "kgf·m": NM_PER_KGF_M,
};

/** Size of each pressure unit in kPa. */
const PRESSURE_IN_KPA: Record<PressureUnit, number> = {
  kPa: 1,
  psi: KPA_PER_PSI,
  bar: 100,
  inHg: KPA_PER_INHG,
  mbar: 0.1,
};

/** Size of each power unit in kW. */
const POWER_IN_KW: Record<PowerUnit, number> = {
  kW: 1,
  hp: KW_PER_HP,
  PS: KW_PER_PS,
};

/** Size of each length unit in mm. */
const LENGTH_IN_MM: Record<LengthUnit, number> = {
  mm: 1,
  in: MM_PER_INCH,
  µm: 0.001,
};

function convertLinear<U extends string>(table: Record<U, number>, units: readonly U[], value: number, from: U, to: U): number {
  requireFinite("value", value);
  requireOneOf("from", from, units);
  requireOneOf("to", to, units);
  if (from === to) return value;
  return (value * table[from]) / table[to];
}

/**
 * Converts a torque. `value` in `from` units → result in `to` units.
 * Factors (NIST SP 811): 1 lbf·ft = 1.355 817 948 331 4 N·m, 1 lbf·in = 0.112 984 829 027 6 N·m,
 * 1 kgf·m = 9.806 65 N·m.
 */
export function convertTorque(value: number, from: TorqueUnit, to: TorqueUnit): number {
  return convertLinear(TORQUE_IN_NM, TORQUE_UNITS, value, from, to);
}

/**
 * Converts a pressure (absolute or gauge alike: no offset is applied).
 * Factors: 1 psi = 6.894 757 293 168 kPa, 1 bar = 100 kPa, 1 mbar = 0.1 kPa,
 * 1 inHg (conventional, mercury 13 595.1 kg/m³, gₙ) = 3.386 388 64 kPa.
 */
export function convertPressure(value: number, from: PressureUnit, to: PressureUnit): number {
  return convertLinear(PRESSURE_IN_KPA, PRESSURE_UNITS, value, from, to);
}

/**
 * Converts a power. Factors: 1 hp (mechanical, 550 ft·lbf/s) = 0.745 699 871 582 27 kW,
 * 1 PS (metric, 75 kgf·m/s) = 0.735 498 75 kW.
 */
export function convertPower(value: number, from: PowerUnit, to: PowerUnit): number {
  return convertLinear(POWER_IN_KW, POWER_UNITS, value, from, to);
}

/** Converts a length. Factors: 1 in = 25.4 mm (exact), 1 µm = 0.001 mm. Negative values (deviations) are allowed. */
export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  return convertLinear(LENGTH_IN_MM, LENGTH_UNITS, value, from, to);
}

/**
 * Converts a temperature between °C (`"C"`), kelvin (`"K"`) and °F (`"F"`).
 * T/K = t/°C + 273.15; t/°F = 1.8 · t/°C + 32. Values below absolute zero throw.
 */
export function convertTemperature(value: number, from: TemperatureUnit, to: TemperatureUnit): number {
  requireFinite("value", value);
  requireOneOf("from", from, TEMPERATURE_UNITS);
  requireOneOf("to", to, TEMPERATURE_UNITS);
  const kelvin = from === "K" ? value : from === "C" ? value + KELVIN_AT_0_C : ((value + 459.67) * 5) / 9;
  if (kelvin < 0) {
    throw new CalcInputError("value", value, `must not be below absolute zero (0 K) in ${from}`);
  }
  if (from === to) return value;
  if (to === "K") return kelvin;
  if (to === "C") return from === "F" ? ((value - 32) * 5) / 9 : kelvin - KELVIN_AT_0_C;
  // to === "F"
  return from === "C" ? value * 1.8 + 32 : kelvin * 1.8 - 459.67;
}
