/**
 * Dyno power correction factors to standard atmospheric conditions, and the water-vapour
 * pressure needed to get dry-air pressure from a humidity reading.
 *
 * Multiply observed power (or torque) by the factor to get corrected power.
 * Conventions pinned here (each formula exactly as published, see each entry):
 * - SAE J1349 uses the 1990 form (1.18 / 0.18 coefficients), T + 273.
 * - ISO 1585 (spark ignition, same as EEC 80/1269) uses T = t + 273.
 * - DIN 70020 uses total barometric pressure: humidity is ignored.
 * - SAE J607 uses °F + 460 and inches of mercury (conventional inHg).
 */
import { CalcInputError, requireFinite, requireInRange, requireNonNegative, requireObject, requireOneOf, requirePositive } from "./errors";
import { KPA_PER_INHG } from "./units";

/** The correction standards implemented. */
export const POWER_CORRECTION_STANDARD_IDS = ["SAE_J1349", "DIN_70020", "ISO_1585", "SAE_J607"] as const;
export type PowerCorrectionStandard = (typeof POWER_CORRECTION_STANDARD_IDS)[number];

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
}

/** Facts about each implemented standard. */
export const POWER_CORRECTION_STANDARDS: Readonly<Record<PowerCorrectionStandard, PowerCorrectionStandardInfo>> = {
  SAE_J1349: {
    label: "SAE J1349 (1990 form)",
    reference: "99 kPa dry-air pressure, 25 °C",
    usesDryAirPressure: true,
    formula: "CF = 1.18 · (990 / Pd[mbar]) · √((t[°C] + 273) / 298) − 0.18",
  },
  DIN_70020: {
    label: "DIN 70020",
    reference: "1013 mbar total pressure, 20 °C, humidity ignored",
    usesDryAirPressure: false,
    formula: "CF = (1013 / p[mbar]) · √((t[°C] + 273) / 293)",
  },
  ISO_1585: {
    label: "ISO 1585 (spark ignition)",
    reference: "99 kPa dry-air pressure, 298 K (25 °C)",
    usesDryAirPressure: true,
    formula: "α = (99 / pd[kPa])^1.2 · ((t[°C] + 273) / 298)^0.6",
  },
  SAE_J607: {
    label: "SAE J607",
    reference: "29.92 inHg dry air, 60 °F",
    usesDryAirPressure: true,
    formula: "CF = (29.92 / Pd[inHg]) · √((t[°F] + 460) / 520)",
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
 * - `DIN_70020` — CF = (1013 / p) · √((t + 273) / 293), p total mbar (vapour pressure ignored).
 * - `ISO_1585` — α = (99 / pd)^1.2 · ((t + 273) / 298)^0.6, pd dry-air kPa, T = t + 273 (pinned).
 * - `SAE_J607` — CF = (29.92 / Pd) · √((t°F + 460) / 520), Pd dry-air inHg.
 *
 * Dry-air pressure = pressureKpa − vaporPressureKpa where the standard uses it.
 */
export function powerCorrectionFactor(standard: PowerCorrectionStandard, conditions: AtmosphericConditions): number {
  requireOneOf("standard", standard, POWER_CORRECTION_STANDARD_IDS);
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
  const dryKpa = pressureKpa - vapor;

  switch (standard) {
    case "SAE_J1349":
      return 1.18 * (990 / (dryKpa * 10)) * Math.sqrt((t + 273) / 298) - 0.18;
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
