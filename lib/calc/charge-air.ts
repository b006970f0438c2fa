/**
 * Charge-air temperatures and density: compressor outlet, intercooler outlet, air density.
 * All temperatures are absolute (K); pressures in kPa.
 */
import { CalcInputError, requireFinite, requireInRange, requirePositive } from "./errors";
import { STANDARD_ATMOSPHERE_KPA } from "./units";

/** Specific gas constant of dry air, J/(kg·K) (ISO 2533 / U.S. Standard Atmosphere 1976). */
export const DRY_AIR_GAS_CONSTANT_J_KG_K = 287.05287;

/**
 * Compressor pressure ratio from gauge boost: PR = (ambientKpa + boostKpa) / ambientKpa.
 * `ambientKpa` defaults to 101.325 kPa. Boost below −ambient throws.
 */
export function pressureRatioFromBoost(boostKpa: number, ambientKpa: number = STANDARD_ATMOSPHERE_KPA): number {
  requireFinite("boostKpa", boostKpa);
  requirePositive("ambientKpa", ambientKpa);
  const absoluteKpa = ambientKpa + boostKpa;
  if (!(absoluteKpa > 0)) {
    throw new CalcInputError("boostKpa", boostKpa, `must leave an absolute pressure > 0 (ambient ${ambientKpa} kPa)`);
  }
  return absoluteKpa / ambientKpa;
}

/**
 * Compressor outlet temperature, K (NASA Glenn Research Center, compressor thermodynamics):
 *   T2 = T1 · [1 + (PR^((γ−1)/γ) − 1) / η]
 * i.e. the isentropic temperature rise divided by the compressor's isentropic efficiency.
 * @param inletK absolute inlet temperature T1, K (> 0)
 * @param pressureRatio outlet/inlet absolute pressure ratio PR (≥ 1)
 * @param efficiency isentropic efficiency η in (0, 1]
 * @param gamma ratio of specific heats γ (> 1), default 1.4 for air
 */
export function compressorOutletTemperatureK(inletK: number, pressureRatio: number, efficiency: number, gamma = 1.4): number {
  requirePositive("inletK", inletK);
  requireFinite("pressureRatio", pressureRatio);
  if (!(pressureRatio >= 1)) {
    throw new CalcInputError("pressureRatio", pressureRatio, "must be ≥ 1 for a compressor");
  }
  requireInRange("efficiency", efficiency, 0, 1, { lowOpen: true });
  requireFinite("gamma", gamma);
  if (!(gamma > 1)) throw new CalcInputError("gamma", gamma, "must be > 1");
  const isentropicRise = Math.pow(pressureRatio, (gamma - 1) / gamma) - 1;
  return inletK * (1 + isentropicRise / efficiency);
}

/**
 * Intercooler outlet temperature, K, from its effectiveness:
 *   ε = (T_in − T_out) / (T_in − T_ambient)  ⇒  T_out = T_in − ε · (T_in − T_ambient).
 * @param effectiveness ε in [0, 1] (0 = no cooling, 1 = down to ambient)
 */
export function intercoolerOutletTemperatureK(hotInK: number, ambientK: number, effectiveness: number): number {
  requirePositive("hotInK", hotInK);
  requirePositive("ambientK", ambientK);
  requireInRange("effectiveness", effectiveness, 0, 1);
  return hotInK - effectiveness * (hotInK - ambientK);
}

/**
 * Intercooler effectiveness from three measured temperatures (any one absolute or Celsius scale,
 * used consistently): ε = (T_in − T_out) / (T_in − T_ambient). Throws when T_in equals T_ambient.
 */
export function intercoolerEffectiveness(hotIn: number, out: number, ambient: number): number {
  requireFinite("hotIn", hotIn);
  requireFinite("out", out);
  requireFinite("ambient", ambient);
  if (hotIn === ambient) {
    throw new CalcInputError("hotIn", hotIn, "must differ from ambient (no temperature difference to cool)");
  }
  return (hotIn - out) / (hotIn - ambient);
}

/**
 * Density of dry air as an ideal gas, kg/m³: ρ = p / (R · T),
 * p = pressureKpa × 1000 Pa, R = 287.052 87 J/(kg·K), T in K.
 */
export function chargeDensityKgM3(pressureKpa: number, temperatureK: number): number {
  requirePositive("pressureKpa", pressureKpa);
  requirePositive("temperatureK", temperatureK);
  return (pressureKpa * 1000) / (DRY_AIR_GAS_CONSTANT_J_KG_K * temperatureK);
}
