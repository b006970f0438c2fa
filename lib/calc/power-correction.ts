/**
 * Dyno power correction factors to standard atmospheric conditions, and the water-vapour
 * pressure needed to get dry-air pressure from a humidity reading.
 *
 * Multiply observed power (or torque) by the factor to get corrected power.
 * Conventions pinned here (each formula exactly as published, see each entry):
 * - SAE J1349 uses the 1990 form (1.18 / 0.18 coefficients), T + 273.
 * - SAE J1349 current form (2004 revision on): 1.176 / 0.176, T = t + 273.15 — from memory, the
 *   SAE text was not to hand; see its `basis`.
 * - ISO 1585 (spark ignition, same as EEC 80/1269) uses T = t + 273.
 * - DIN 70020 uses total barometric pressure: humidity is ignored.
 * - SAE J607 uses °F + 460 and inches of mercury (conventional inHg).
 */
import { CalcInputError, requireFinite, requireInRange, requireNonNegative, requireObject, requireOneOf, requirePositive } from "./errors";
import { KELVIN_AT_0_C, KPA_PER_INHG } from "./units";
import { formatNumber } from "./quantity";

/**
 * The correction standards a dyno run can be recorded under and compared at: both SAE J1349 forms
 * (1990 and current), DIN 70020, ISO 1585 and SAE J607. The dyno record's database check holds the
 * same list (migration 2026_12_03_070_dyno_current_j1349).
 */
export const POWER_CORRECTION_STANDARD_IDS = ["SAE_J1349", "SAE_J1349_CURRENT", "DIN_70020", "ISO_1585", "SAE_J607"] as const;
export type PowerCorrectionStandard = (typeof POWER_CORRECTION_STANDARD_IDS)[number];

/** Every standard the factor can be worked out for (the same list since the dyno record takes the current J1349 form). */
export const ALL_POWER_CORRECTION_STANDARD_IDS = POWER_CORRECTION_STANDARD_IDS;
export type AnyPowerCorrectionStandard = PowerCorrectionStandard;

/**
 * Shown beside every corrected figure: the formulas assume power follows air density. A turbo
 * engine whose boost controller holds manifold pressure loses far less power in thin or hot air, so
 * correcting it raises its figure too much.
 */
export const BOOSTED_ENGINE_CAUTION =
  "These corrections assume power follows air density. A turbo engine whose boost control holds manifold pressure is over-corrected: compare its runs as measured, or at one standard made in the same conditions.";

/**
 * Shown where the air pressure is entered: the correction needs the pressure where the engine
 * breathes, not the weather report's sea-level figure (about 11 % apart at 1 000 m).
 */
export const STATION_PRESSURE_NOTE =
  "Enter the air pressure at the dyno (station pressure), not the weather report's sea-level pressure; give the altitude and the sea-level pressure to have it worked out.";

/** Display facts about each standard (for pickers and reports). */
export interface PowerCorrectionStandardInfo {
  /** Short name with the chosen form, e.g. "SAE J1349 (1990 form)". */
  label: string;
  /** Reference (standard) conditions the factor corrects to. */
  reference: string;
  /** True when the formula uses dry-air pressure (barometric minus water-vapour pressure). */
  usesDryAirPressure: boolean;
  /** The formula as implemented. */
  formula: string;
  /** How sure the formula is: where it was read, or "from memory". */
  formulaBasis: string;
}

/** Facts about each implemented standard. */
export const POWER_CORRECTION_STANDARDS: Readonly<Record<AnyPowerCorrectionStandard, PowerCorrectionStandardInfo>> = {
  SAE_J1349: {
    label: "SAE J1349 (1990 form)",
    reference: "99 kPa dry-air pressure, 25 °C",
    usesDryAirPressure: true,
    formula: "CF = 1.18 · (990 / Pd[mbar]) · √((t[°C] + 273) / 298) − 0.18",
    formulaBasis: "Formula read on a public page.",
  },
  SAE_J1349_CURRENT: {
    label: "SAE J1349 (current form, 2004 revision on)",
    reference: "99 kPa dry-air pressure, 298 K (24.85 °C; the factor is 1.0003 at 25 °C)",
    usesDryAirPressure: true,
    formula: "CF = 1.176 · (99 / pd[kPa]) · √((t[°C] + 273.15) / 298) − 0.176",
    formulaBasis:
      "From memory: the 2004 revision's coefficients 1.176 / 0.176 with dry-air pressure and temperature exponent 0.5; the SAE text was not to hand. T = t + 273.15 pinned here. Within 0.0006 of the 1990 form between 90–105 kPa and 15–35 °C.",
  },
  DIN_70020: {
    label: "DIN 70020",
    reference: "1013 mbar total pressure, 20 °C, humidity ignored",
    usesDryAirPressure: false,
    formula: "CF = (1013 / p[mbar]) · √((t[°C] + 273) / 293)",
    formulaBasis: "Formula read on a public page.",
  },
  ISO_1585: {
    label: "ISO 1585 (spark ignition)",
    reference: "99 kPa dry-air pressure, 298 K (25 °C)",
    usesDryAirPressure: true,
    formula: "α = (99 / pd[kPa])^1.2 · ((t[°C] + 273) / 298)^0.6",
    formulaBasis: "Formula read on a public page.",
  },
  SAE_J607: {
    label: "SAE J607",
    reference: "29.92 inHg dry air, 60 °F",
    usesDryAirPressure: true,
    formula: "CF = (29.92 / Pd[inHg]) · √((t[°F] + 460) / 520)",
    formulaBasis: "Formula read on a public page.",
  },
};

/** Observed conditions at the dyno's air intake. */
export interface AtmosphericConditions {
  /** Observed (total) barometric pressure, kPa. */
  pressureKpa: number;
  /** Intake air temperature, °C. */
  temperatureC: number;
  /** Partial pressure of water vapour, kPa (default 0 = dry); see {@link vaporPressureKpa}. */
  vaporPressureKpa?: number;
}

/**
 * Power correction factor (dimensionless) for `standard` at the observed `conditions`.
 * Corrected power = observed power × factor.
 *
 * - `SAE_J1349` — 1990 form: CF = 1.18 · (990 / Pd) · √((t + 273) / 298) − 0.18, Pd dry-air mbar.
 * - `SAE_J1349_CURRENT` — 2004 revision on (from memory): CF = 1.176 · (99 / pd) · √((t + 273.15) / 298) − 0.176, pd dry-air kPa.
 * - `DIN_70020` — CF = (1013 / p) · √((t + 273) / 293), p total mbar (vapour pressure ignored).
 * - `ISO_1585` — α = (99 / pd)^1.2 · ((t + 273) / 298)^0.6, pd dry-air kPa, T = t + 273 (pinned).
 * - `SAE_J607` — CF = (29.92 / Pd) · √((t°F + 460) / 520), Pd dry-air inHg.
 *
 * Dry-air pressure = pressureKpa − vaporPressureKpa where the standard uses it.
 */
export function powerCorrectionFactor(standard: AnyPowerCorrectionStandard, conditions: AtmosphericConditions): number {
  requireOneOf("standard", standard, ALL_POWER_CORRECTION_STANDARD_IDS);
  const { pressureKpa, t, dryKpa } = readConditions(conditions);

  switch (standard) {
    case "SAE_J1349":
      return 1.18 * (990 / (dryKpa * 10)) * Math.sqrt((t + 273) / 298) - 0.18;
    case "SAE_J1349_CURRENT":
      return 1.176 * (99 / dryKpa) * Math.sqrt((t + KELVIN_AT_0_C) / 298) - 0.176;
    case "DIN_70020":
      return (1013 / (pressureKpa * 10)) * Math.sqrt((t + 273) / 293);
    case "ISO_1585":
      return Math.pow(99 / dryKpa, 1.2) * Math.pow((t + 273) / 298, 0.6);
    case "SAE_J607": {
      const dryInHg = dryKpa / KPA_PER_INHG;
      const tF = t * 1.8 + 32;
      return (29.92 / dryInHg) * Math.sqrt((tF + 460) / 520);
    }
  }
}

/** Checks observed conditions; returns total and dry-air pressure (kPa) and temperature (°C). */
function readConditions(conditions: AtmosphericConditions): { pressureKpa: number; t: number; dryKpa: number } {
  requireObject("conditions", conditions);
  const pressureKpa = requirePositive("conditions.pressureKpa", conditions.pressureKpa);
  const t = requireFinite("conditions.temperatureC", conditions.temperatureC);
  if (!(t > -273.15)) {
    throw new CalcInputError("conditions.temperatureC", t, "must be above absolute zero (−273.15 °C)");
  }
  const vapor =
    conditions.vaporPressureKpa === undefined ? 0 : requireNonNegative("conditions.vaporPressureKpa", conditions.vaporPressureKpa);
  if (!(vapor < pressureKpa)) {
    throw new CalcInputError("conditions.vaporPressureKpa", vapor, `must be below the barometric pressure (${pressureKpa} kPa)`);
  }
  return { pressureKpa, t, dryKpa: pressureKpa - vapor };
}

/** A closed range [min, max]. */
export interface ValidityInterval {
  min: number;
  max: number;
}

/** Conditions inside which a standard's correction is meant to be used. */
export interface CorrectionValidity {
  /** Intake air temperature, °C; null when none is on record. */
  temperatureC: ValidityInterval | null;
  /** Pressure, kPa — dry-air or total as `pressureKind` says; null when none is on record. */
  pressureKpa: ValidityInterval | null;
  pressureKind: "dry-air" | "total";
  /** Limits on the factor itself; null when none is on record. */
  factor: ValidityInterval | null;
  /** How humidity enters the standard. */
  humidity: string;
  /** Where the limits come from and how sure they are. */
  basis: string;
}

const J1349_VALIDITY: CorrectionValidity = {
  temperatureC: { min: 15, max: 35 },
  pressureKpa: { min: 90, max: 105 },
  pressureKind: "dry-air",
  factor: null,
  humidity: "Through dry-air pressure: the water-vapour pressure is taken off the barometric pressure.",
  basis:
    "From memory: SAE J1349 gives 15–35 °C intake air and 90–105 kPa dry-air pressure for the correction; the SAE text was not to hand.",
};

/**
 * Validity range of each correction standard, as data. Figures marked "from memory" were not read
 * from the standard's text (the texts are licensed); where nothing is on record the fields are null
 * and {@link correctionValidity} says so instead of guessing.
 */
export const POWER_CORRECTION_VALIDITY: Readonly<Record<AnyPowerCorrectionStandard, Readonly<CorrectionValidity>>> = {
  SAE_J1349: J1349_VALIDITY,
  SAE_J1349_CURRENT: J1349_VALIDITY,
  ISO_1585: {
    temperatureC: { min: 15, max: 35 },
    pressureKpa: null,
    pressureKind: "dry-air",
    factor: { min: 0.93, max: 1.07 },
    humidity: "Through dry-air pressure: the water-vapour pressure is taken off the barometric pressure.",
    basis:
      "From memory: ISO 1585 / EEC 80/1269 test conditions 288–308 K (15–35 °C) and a factor between 0.93 and 1.07; a pressure range is not on record here (the factor limit bounds it).",
  },
  DIN_70020: {
    temperatureC: null,
    pressureKpa: null,
    pressureKind: "total",
    factor: null,
    humidity: "Ignored: the formula uses total barometric pressure.",
    basis: "No validity range is on record here for DIN 70020.",
  },
  SAE_J607: {
    temperatureC: null,
    pressureKpa: null,
    pressureKind: "dry-air",
    factor: null,
    humidity: "Through dry-air pressure: the water-vapour pressure is taken off the barometric pressure.",
    basis: "No validity range is on record here for SAE J607.",
  },
};

/**
 * A standard's validity range in words, e.g. "Valid for intake air 15–35 °C, dry-air pressure
 * 90–105 kPa (from memory)"; says so when none is on record.
 */
export function validityRangeWords(standard: AnyPowerCorrectionStandard): string {
  const v = POWER_CORRECTION_VALIDITY[standard];
  const span = (i: ValidityInterval, unit: string) => `${formatNumber(i.min)}–${formatNumber(i.max)}${unit}`;
  const parts = [
    v.temperatureC && `intake air ${span(v.temperatureC, " °C")}`,
    v.pressureKpa && `${v.pressureKind === "dry-air" ? "dry-air pressure" : "air pressure"} ${span(v.pressureKpa, " kPa")}`,
    v.factor && `a factor of ${span(v.factor, "")}`,
  ].filter((x): x is string => Boolean(x));
  if (parts.length === 0) return "No validity range is on record for this standard.";
  return `Valid for ${parts.join(", ")}${v.basis.startsWith("From memory") ? " (from memory)" : ""}.`;
}

/** One condition outside a standard's range. */
export interface ValidityFinding {
  quantity: "temperature" | "pressure" | "factor";
  /** In workshop words, e.g. "Intake air 38 °C is above the 35 °C upper limit of SAE J1349 (1990 form) (15–35 °C)." */
  message: string;
}

export interface ValidityCheck {
  standard: AnyPowerCorrectionStandard;
  /** False when no range at all is on record for the standard (then `inside` is true and means "not checked"). */
  rangeKnown: boolean;
  /** True when nothing on record is exceeded. */
  inside: boolean;
  outside: ValidityFinding[];
  /** The factor at these conditions. */
  factor: number;
  /** Where the limits come from. */
  basis: string;
}

function checkInterval(
  value: number,
  interval: ValidityInterval | null,
  what: string,
  unit: string,
  label: string,
  quantity: ValidityFinding["quantity"],
): ValidityFinding | null {
  if (interval === null) return null;
  const show = (x: number) => `${formatNumber(Number(x.toFixed(unit === "" ? 3 : 1)))}${unit}`;
  const span = `${formatNumber(interval.min)}–${formatNumber(interval.max)}${unit}`;
  if (value < interval.min) {
    return { quantity, message: `${what} ${show(value)} is below the ${show(interval.min)} lower limit of ${label} (${span}).` };
  }
  if (value > interval.max) {
    return { quantity, message: `${what} ${show(value)} is above the ${show(interval.max)} upper limit of ${label} (${span}).` };
  }
  return null;
}

/**
 * Whether the observed conditions are inside `standard`'s validity range
 * ({@link POWER_CORRECTION_VALIDITY}), and which are not, in workshop words. Checks the intake air
 * temperature, the pressure (dry-air or total, as the standard uses) and the factor itself, where
 * the standard has a limit on record. Exactly at a limit is inside.
 */
export function correctionValidity(standard: AnyPowerCorrectionStandard, conditions: AtmosphericConditions): ValidityCheck {
  const factor = powerCorrectionFactor(standard, conditions);
  const { pressureKpa, t, dryKpa } = readConditions(conditions);
  const v = POWER_CORRECTION_VALIDITY[standard];
  const label = POWER_CORRECTION_STANDARDS[standard].label;
  const pressure = v.pressureKind === "dry-air" ? dryKpa : pressureKpa;
  const findings = [
    checkInterval(t, v.temperatureC, "Intake air", " °C", label, "temperature"),
    checkInterval(pressure, v.pressureKpa, v.pressureKind === "dry-air" ? "Dry-air pressure" : "Air pressure", " kPa", label, "pressure"),
    checkInterval(factor, v.factor, "Correction factor", "", label, "factor"),
  ].filter((f): f is ValidityFinding => f !== null);
  return {
    standard,
    rangeKnown: v.temperatureC !== null || v.pressureKpa !== null || v.factor !== null,
    inside: findings.length === 0,
    outside: findings,
    factor,
    basis: v.basis,
  };
}

/**
 * Saturation vapour pressure over liquid water, kPa — Buck equation (Buck 1981, 1996 revision):
 *   es = 0.61121 · exp((18.678 − t/234.5) · (t / (257.14 + t))),  t in °C.
 * Accepted for −80 °C ≤ t ≤ 100 °C; most accurate from 0 to 50 °C (dyno-room range).
 * Below 0 °C it gives the value over supercooled water, the usual basis for relative humidity.
 */
export function saturationVaporPressureKpa(temperatureC: number): number {
  requireInRange("temperatureC", temperatureC, -80, 100);
  const t = temperatureC;
  return 0.61121 * Math.exp((18.678 - t / 234.5) * (t / (257.14 + t)));
}

/**
 * Partial pressure of water vapour, kPa, from air temperature (°C) and relative humidity (%):
 *   pv = RH/100 · es(t), es from the Buck equation ({@link saturationVaporPressureKpa}).
 */
export function vaporPressureKpa(temperatureC: number, relativeHumidityPercent: number): number {
  requireInRange("relativeHumidityPercent", relativeHumidityPercent, 0, 100);
  return (relativeHumidityPercent / 100) * saturationVaporPressureKpa(temperatureC);
}
