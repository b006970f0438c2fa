/**
 * Compressor operating points across the rev range: for each engine speed, the air the engine
 * takes (from displacement, volumetric efficiency and manifold conditions), corrected to the map's
 * reference, and the pressure ratio the compressor must make (boost plus losses).
 */
import { CalcInputError, requireObject } from "./errors";
import { INPUT_RULES } from "./input-rules";
import { requireQuantity, relabel } from "./quantity";
import { compressorOutletTemperatureK, intercoolerOutletTemperatureK } from "./charge-air";
import { checkFlowReference, compressorPressureRatio, correctedAirFlow, engineAirMassFlowKgS, type FlowReference } from "./engine-airflow";
import { MAX_CURVE_POINTS, readRpmCurve, type RpmCurveInput } from "./rpm-curve";

export interface OperatingPointsInput {
  /** Swept volume of all cylinders, cc. */
  displacementCc: number;
  /** Engine speeds to work out, rpm (1 to 200 of them, e.g. every 500 rpm from 3 000 to 11 000). */
  rpm: readonly number[];
  /** Volumetric efficiency (fraction): one figure, or points against rpm covering every speed in `rpm`. */
  volumetricEfficiency: RpmCurveInput;
  /** Gauge boost in the manifold, kPa: one figure, or points against rpm covering every speed in `rpm`. */
  boostKpa: RpmCurveInput;
  /** Air pressure where the engine breathes (station pressure), kPa absolute. */
  stationPressureKpa: number;
  /** Air temperature at the compressor inlet (ambient), K. */
  ambientTempK: number;
  /** Loss across the air filter before the compressor, kPa; default 0. */
  filterLossKpa?: number;
  /** Loss across the intercooler, kPa; default 0. */
  intercoolerDropKpa?: number;
  /** Loss in the charge piping after the compressor, kPa; default 0. */
  pipingDropKpa?: number;
  /**
   * Manifold air temperature, K, when known (logged or assumed) — used at every speed.
   * When absent, it is worked out from `compressorEfficiency` and `intercoolerEffectiveness`.
   */
  manifoldTempK?: number;
  /** Compressor isentropic efficiency from the map (fraction, 0.3–0.9); needed without `manifoldTempK`. */
  compressorEfficiency?: number;
  /** Intercooler effectiveness (fraction, 0–1; 0 for none); needed without `manifoldTempK`. */
  intercoolerEffectiveness?: number;
  /** Reference the flow is corrected to; default {@link STANDARD_FLOW_REFERENCE}. Use the map's. */
  reference?: FlowReference;
}

export interface CompressorOperatingPoint {
  rpm: number;
  volumetricEfficiency: number;
  boostKpa: number;
  /** Absolute pressures, kPa. */
  inletKpa: number;
  manifoldKpa: number;
  outletKpa: number;
  pressureRatio: number;
  /** Worked-out compressor outlet temperature, K; null when the manifold temperature was given. */
  compressorOutletTempK: number | null;
  manifoldTempK: number;
  /** Actual air mass flow, kg/s. */
  airMassFlowKgS: number;
  /** Corrected to `reference` of the result. */
  correctedFlowKgS: number;
  correctedFlowLbMin: number;
}

export interface CompressorOperatingPoints {
  reference: FlowReference;
  points: CompressorOperatingPoint[];
}

/**
 * Operating points of the compressor at each engine speed in `input.rpm` (in the order given):
 * - pressures from {@link compressorPressureRatio} (boost measured in the manifold, losses added);
 * - manifold temperature as given, or T₂ = T₁·[1 + (PR^(0.4/1.4) − 1)/η] (NASA Glenn compressor
 *   thermodynamics) cooled by the intercooler, T = T₂ − ε·(T₂ − T_ambient);
 * - air mass flow by {@link engineAirMassFlowKgS} at manifold pressure and temperature (no blow-off,
 *   so the compressor moves what the engine takes);
 * - corrected flow by {@link correctedAirFlow} at the compressor inlet (ambient temperature,
 *   station pressure less the filter loss).
 */
export function compressorOperatingPoints(input: OperatingPointsInput): CompressorOperatingPoints {
  requireObject("input", input);
  if (!Array.isArray(input.rpm) || input.rpm.length < 1 || input.rpm.length > MAX_CURVE_POINTS) {
    const n = Array.isArray(input.rpm) ? input.rpm.length : 0;
    throw new CalcInputError("The rev range", input.rpm, `must list from 1 to ${MAX_CURVE_POINTS} engine speeds`, {
      shown: `${n} engine speeds.`,
      field: "rpm",
    });
  }
  const speeds = input.rpm.map((r, i) => requireQuantity(INPUT_RULES.engineSpeed, r, `rpm[${i}]`));
  const veAt = readRpmCurve(input.volumetricEfficiency, INPUT_RULES.volumetricEfficiency, "volumetricEfficiency");
  const boostAt = readRpmCurve(input.boostKpa, INPUT_RULES.boost, "boostKpa");
  const ambientK = requireQuantity(INPUT_RULES.ambientTemperature, input.ambientTempK, "ambientTempK");
  const reference = checkFlowReference(input.reference);

  let fixedManifoldK: number | null = null;
  let efficiency = 0;
  let effectiveness = 0;
  if (input.manifoldTempK !== undefined) {
    fixedManifoldK = requireQuantity(INPUT_RULES.manifoldTemperature, input.manifoldTempK, "manifoldTempK");
  } else {
    const need = "is needed to work out the manifold air temperature (or enter the manifold air temperature)";
    if (input.compressorEfficiency === undefined) {
      throw new CalcInputError(INPUT_RULES.compressorEfficiency.label, undefined, need, {
        shown: "nothing.",
        field: "compressorEfficiency",
      });
    }
    if (input.intercoolerEffectiveness === undefined) {
      throw new CalcInputError(INPUT_RULES.intercoolerEffectiveness.label, undefined, `${need}; use 0 without an intercooler`, {
        shown: "nothing.",
        field: "intercoolerEffectiveness",
      });
    }
    efficiency = requireQuantity(INPUT_RULES.compressorEfficiency, input.compressorEfficiency, "compressorEfficiency");
    effectiveness = requireQuantity(INPUT_RULES.intercoolerEffectiveness, input.intercoolerEffectiveness, "intercoolerEffectiveness");
  }

  const points = speeds.map((rpm): CompressorOperatingPoint => {
    const volumetricEfficiency = veAt(rpm);
    const boostKpa = boostAt(rpm);
    const pressures = compressorPressureRatio({
      boostKpa,
      stationPressureKpa: input.stationPressureKpa,
      filterLossKpa: input.filterLossKpa,
      intercoolerDropKpa: input.intercoolerDropKpa,
      pipingDropKpa: input.pipingDropKpa,
    });
    let compressorOutletTempK: number | null = null;
    let manifoldTempK: number;
    if (fixedManifoldK !== null) {
      manifoldTempK = fixedManifoldK;
    } else {
      compressorOutletTempK = compressorOutletTemperatureK(ambientK, pressures.pressureRatio, efficiency);
      manifoldTempK = intercoolerOutletTemperatureK(compressorOutletTempK, ambientK, effectiveness);
      // a worked-out temperature beyond the range means the inputs together are impossible
      requireQuantity(
        relabel(INPUT_RULES.manifoldTemperature, "Worked-out manifold air temperature"),
        manifoldTempK,
        "compressorEfficiency",
      );
    }
    const airMassFlowKgS = engineAirMassFlowKgS({
      displacementCc: input.displacementCc,
      rpm,
      volumetricEfficiency,
      manifoldPressureKpa: pressures.manifoldKpa,
      manifoldTempK,
    });
    const corrected = correctedAirFlow({
      massFlowKgS: airMassFlowKgS,
      inletPressureKpa: pressures.inletKpa,
      inletTempK: ambientK,
      reference,
    });
    return {
      rpm,
      volumetricEfficiency,
      boostKpa,
      ...pressures,
      compressorOutletTempK,
      manifoldTempK,
      airMassFlowKgS,
      correctedFlowKgS: corrected.kgS,
      correctedFlowLbMin: corrected.lbMin,
    };
  });
  return { reference, points };
}
