/**
 * Air pressure at the engine from a weather report's sea-level figure and the altitude.
 *
 * Weather services report pressure reduced to sea level; a dyno correction needs the pressure where
 * the engine breathes (station pressure). At 1 000 m the two differ by about 11 %.
 */
import { INPUT_RULES } from "./input-rules";
import { requireQuantity } from "./quantity";
import { DRY_AIR_GAS_CONSTANT_J_KG_K } from "./charge-air";
import { STANDARD_ATMOSPHERE_K, STANDARD_GRAVITY_M_S2 } from "./units";

/** Temperature lapse rate of the troposphere, K/m (ISO 2533 / U.S. Standard Atmosphere 1976). */
export const TROPOSPHERE_LAPSE_RATE_K_M = 0.0065;

/** Exponent g₀ / (R · L) of the barometric formula, ≈ 5.25588 (ISO 2533 constants). */
const BAROMETRIC_EXPONENT = STANDARD_GRAVITY_M_S2 / (DRY_AIR_GAS_CONSTANT_J_KG_K * TROPOSPHERE_LAPSE_RATE_K_M);

/**
 * Station pressure, kPa, at `altitudeM` above sea level for a sea-level pressure
 * `seaLevelPressureKpa` — the standard-atmosphere barometric relation for the troposphere
 * (ISO 2533 / U.S. Standard Atmosphere 1976, constant lapse rate):
 *   p = p₀ · (1 − L·h / T₀)^(g₀ / (R·L)),  L = 0.0065 K/m, T₀ = 288.15 K, g₀ = 9.806 65 m/s²,
 *   R = 287.052 87 J/(kg·K); i.e. p = p₀ · (1 − 2.25577×10⁻⁵ · h)^5.25588.
 * h is taken as geopotential altitude (differs from height above sea level by < 0.1 % below 5 km).
 * Ranges: sea-level pressure 85–110 kPa, altitude −500 to 11 000 m (the troposphere).
 */
export function stationPressureKpa(seaLevelPressureKpa: number, altitudeM: number): number {
  const p0 = requireQuantity(INPUT_RULES.seaLevelPressure, seaLevelPressureKpa, "seaLevelPressureKpa");
  const h = requireQuantity(INPUT_RULES.altitude, altitudeM, "altitudeM");
  return p0 * Math.pow(1 - (TROPOSPHERE_LAPSE_RATE_K_M * h) / STANDARD_ATMOSPHERE_K, BAROMETRIC_EXPONENT);
}
