/**
 * How well an intercooler worked, from temperatures and pressures logged on a pull.
 */
import { CalcInputError, requireObject } from "./errors";
import { INPUT_RULES } from "./input-rules";
import { formatNumber, requireQuantity, withUnit } from "./quantity";
import { intercoolerEffectiveness } from "./charge-air";
import { KELVIN_AT_0_C } from "./units";

export interface IntercoolerLogSample {
  /** Charge temperature going into the intercooler (after the compressor), K. */
  inletTempK: number;
  /** Charge temperature coming out of the intercooler, K. */
  outletTempK: number;
  /** Ambient air temperature (the air cooling the intercooler), K. */
  ambientTempK: number;
  /** Absolute pressure before the intercooler, kPa; give both pressures or neither. */
  inletPressureKpa?: number;
  /** Absolute pressure after the intercooler, kPa. */
  outletPressureKpa?: number;
}

export interface IntercoolerLogResult {
  /** ε = (T_in − T_out) / (T_in − T_ambient); 1 means down to ambient. Above 1 or below 0 points at a sensor. */
  effectiveness: number;
  /** T_in − T_out, K (= °C difference). */
  temperatureDropK: number;
  /** p_in − p_out, kPa; null when pressures were not logged. */
  pressureDropKpa: number | null;
  /** (p_in − p_out) / p_in; null when pressures were not logged. */
  pressureDropFraction: number | null;
}

const celsius = (k: number) => formatNumber(Number((k - KELVIN_AT_0_C).toFixed(2)));

/**
 * Intercooler effectiveness and pressure drop from one logged sample:
 *   ε = (T_in − T_out) / (T_in − T_ambient)  (the usual heat-exchanger effectiveness with the
 *   charge as the hot stream and ambient air as the coolant), Δp = p_in − p_out.
 * Returned as computed: a sensor error shows as ε above 1 or below 0, or a negative pressure drop.
 * Throws when the inlet is not warmer than ambient (nothing to rate).
 */
export function intercoolerFromLog(sample: IntercoolerLogSample): IntercoolerLogResult {
  requireObject("sample", sample);
  const tin = requireQuantity(INPUT_RULES.intercoolerInletTemperature, sample.inletTempK, "inletTempK");
  const tout = requireQuantity(INPUT_RULES.intercoolerOutletTemperature, sample.outletTempK, "outletTempK");
  const tamb = requireQuantity(INPUT_RULES.ambientTemperature, sample.ambientTempK, "ambientTempK");
  if (!(tin > tamb)) {
    throw new CalcInputError(
      INPUT_RULES.intercoolerInletTemperature.label,
      tin,
      `must be above the ambient air temperature (${withUnit(tamb, "K")}, ${celsius(tamb)} °C) to rate the intercooler`,
      { shown: `${withUnit(tin, "K")} (${celsius(tin)} °C).`, field: "inletTempK" },
    );
  }
  const hasIn = sample.inletPressureKpa !== undefined;
  const hasOut = sample.outletPressureKpa !== undefined;
  if (hasIn !== hasOut) {
    const missing = hasIn ? INPUT_RULES.intercoolerOutletPressure : INPUT_RULES.intercoolerInletPressure;
    throw new CalcInputError(missing.label, undefined, "is needed with the other intercooler pressure (give both or neither)", {
      shown: "nothing.",
      field: hasIn ? "outletPressureKpa" : "inletPressureKpa",
    });
  }
  let pressureDropKpa: number | null = null;
  let pressureDropFraction: number | null = null;
  if (hasIn) {
    const pin = requireQuantity(INPUT_RULES.intercoolerInletPressure, sample.inletPressureKpa, "inletPressureKpa");
    const pout = requireQuantity(INPUT_RULES.intercoolerOutletPressure, sample.outletPressureKpa, "outletPressureKpa");
    pressureDropKpa = pin - pout;
    pressureDropFraction = pressureDropKpa / pin;
  }
  return {
    effectiveness: intercoolerEffectiveness(tin, tout, tamb),
    temperatureDropK: tin - tout,
    pressureDropKpa,
    pressureDropFraction,
  };
}
