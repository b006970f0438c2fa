/**
 * Air the engine swallows and where that puts the compressor: engine air mass flow (four-stroke),
 * corrected flow at a map's reference conditions, and the pressure ratio across the compressor.
 */
import { requireObject } from "./errors";
import { INPUT_RULES } from "./input-rules";
import { requireQuantity } from "./quantity";
import { DRY_AIR_GAS_CONSTANT_J_KG_K } from "./charge-air";
import { KG_PER_POUND, STANDARD_ATMOSPHERE_K, STANDARD_ATMOSPHERE_KPA } from "./units";

/** Inputs of {@link engineAirMassFlowKgS}. */
export interface EngineAirflowInput {
  /** Swept volume of all cylinders, cc (20–10 000). */
  displacementCc: number;
  /** Engine speed, rpm (1–25 000). */
  rpm: number;
  /** Volumetric efficiency referred to manifold conditions, as a fraction (more than 0, at most 1.5). */
  volumetricEfficiency: number;
  /** Absolute manifold pressure, kPa (10–700). */
  manifoldPressureKpa: number;
  /** Manifold air temperature, K (220–500). */
  manifoldTempK: number;
}

/**
 * Air mass flow of a four-stroke engine, kg/s (Heywood, *Internal Combustion Engine Fundamentals*,
 * ch. 2, volumetric efficiency referred to inlet-manifold density; ideal gas):
 *   ṁ = ηv · ρ · Vd · (N / 2) / 60,  ρ = p / (R · T),  R = 287.052 87 J/(kg·K),
 * Vd in m³ (cc × 10⁻⁶), N in rpm; each cylinder fills once every two revolutions.
 */
export function engineAirMassFlowKgS(input: EngineAirflowInput): number {
  requireObject("input", input);
  const vd = requireQuantity(INPUT_RULES.displacement, input.displacementCc, "displacementCc") * 1e-6;
  const n = requireQuantity(INPUT_RULES.engineSpeed, input.rpm, "rpm");
  const ve = requireQuantity(INPUT_RULES.volumetricEfficiency, input.volumetricEfficiency, "volumetricEfficiency");
  const p = requireQuantity(INPUT_RULES.manifoldPressure, input.manifoldPressureKpa, "manifoldPressureKpa") * 1000;
  const t = requireQuantity(INPUT_RULES.manifoldTemperature, input.manifoldTempK, "manifoldTempK");
  const density = p / (DRY_AIR_GAS_CONSTANT_J_KG_K * t);
  return (ve * density * vd * (n / 2)) / 60;
}

/** Conditions a compressor map's flow axis is corrected to. Makers differ: use the one on the sheet. */
export interface FlowReference {
  /** Absolute reference pressure, kPa (50–110). */
  pressureKpa: number;
  /** Reference temperature, K (250–330). */
  temperatureK: number;
}

/**
 * Default reference for corrected flow: the ISO 2533 / U.S. Standard Atmosphere 1976 sea level,
 * 101.325 kPa (29.92 inHg) and 288.15 K (15 °C, 59 °F). Compressor makers print their own
 * reference on the map; enter that one to read flow off their sheet.
 */
export const STANDARD_FLOW_REFERENCE: Readonly<FlowReference> = Object.freeze({
  pressureKpa: STANDARD_ATMOSPHERE_KPA,
  temperatureK: STANDARD_ATMOSPHERE_K,
});

/** Pounds per minute in one kilogram per second: 60 / 0.453 592 37 (exact pound, NIST SP 811). */
export const LB_MIN_PER_KG_S = 60 / KG_PER_POUND;

export interface CorrectedFlowInput {
  /** Actual air mass flow through the compressor, kg/s (more than 0, at most 10). */
  massFlowKgS: number;
  /** Absolute pressure at the compressor inlet, kPa (30–110): station pressure minus the filter loss. */
  inletPressureKpa: number;
  /** Air temperature at the compressor inlet, K (220–340). */
  inletTempK: number;
  /** Defaults to {@link STANDARD_FLOW_REFERENCE}. */
  reference?: FlowReference;
}

export interface CorrectedFlow {
  kgS: number;
  lbMin: number;
  reference: FlowReference;
}

/**
 * Corrected (reduced) air mass flow, the quantity a compressor map's flow axis shows:
 *   ṁ_corr = ṁ · √(T₁ / T_ref) / (p₁ / p_ref)
 * (the usual corrected-flow definition of turbomachinery, e.g. Dixon & Hall, *Fluid Mechanics and
 * Thermodynamics of Turbomachinery*, dimensional analysis ch. 1; from memory). T₁, p₁ at the
 * compressor inlet; returned in kg/s and lb/min (1 lb = 0.453 592 37 kg).
 */
export function correctedAirFlow(input: CorrectedFlowInput): CorrectedFlow {
  requireObject("input", input);
  const m = requireQuantity(INPUT_RULES.airMassFlow, input.massFlowKgS, "massFlowKgS");
  const p1 = requireQuantity(INPUT_RULES.compressorInletPressure, input.inletPressureKpa, "inletPressureKpa");
  const t1 = requireQuantity(INPUT_RULES.compressorInletTemperature, input.inletTempK, "inletTempK");
  const reference = checkFlowReference(input.reference);
  const kgS = (m * Math.sqrt(t1 / reference.temperatureK)) / (p1 / reference.pressureKpa);
  return { kgS, lbMin: kgS * LB_MIN_PER_KG_S, reference };
}

/** Checks a flow reference (or gives the standard one when absent). */
export function checkFlowReference(reference: FlowReference | undefined): FlowReference {
  if (reference === undefined) return { ...STANDARD_FLOW_REFERENCE };
  requireObject("reference", reference);
  return {
    pressureKpa: requireQuantity(INPUT_RULES.referencePressure, reference.pressureKpa, "reference.pressureKpa"),
    temperatureK: requireQuantity(INPUT_RULES.referenceTemperature, reference.temperatureK, "reference.temperatureK"),
  };
}

export interface CompressorPressureInput {
  /** Gauge boost in the manifold, kPa above the air pressure (0–600). */
  boostKpa: number;
  /** Air pressure where the engine breathes (station pressure), kPa absolute (50–110). */
  stationPressureKpa: number;
  /** Pressure lost across the air filter and intake before the compressor, kPa (0–20); default 0. */
  filterLossKpa?: number;
  /** Pressure lost across the intercooler, kPa (0–50); default 0. */
  intercoolerDropKpa?: number;
  /** Pressure lost in the charge piping and throttle body, kPa (0–50); default 0. */
  pipingDropKpa?: number;
}

export interface CompressorPressures {
  /** Compressor inlet, kPa absolute = station − filter loss. */
  inletKpa: number;
  /** Manifold, kPa absolute = station + boost. */
  manifoldKpa: number;
  /** Compressor outlet, kPa absolute = manifold + intercooler drop + piping drop. */
  outletKpa: number;
  /** outlet / inlet (absolute). */
  pressureRatio: number;
}

/**
 * Pressure ratio across the compressor (total-to-total, as on a compressor map):
 *   PR = (p_station + boost + Δp_intercooler + Δp_piping) / (p_station − Δp_filter).
 * Boost is measured in the manifold, so every loss after the compressor adds to what it must make
 * and every loss before it lowers what it starts from.
 */
export function compressorPressureRatio(input: CompressorPressureInput): CompressorPressures {
  requireObject("input", input);
  const boost = requireQuantity(INPUT_RULES.boost, input.boostKpa, "boostKpa");
  const station = requireQuantity(INPUT_RULES.stationPressure, input.stationPressureKpa, "stationPressureKpa");
  const filter = requireQuantity(INPUT_RULES.filterLoss, input.filterLossKpa ?? 0, "filterLossKpa");
  const cooler = requireQuantity(INPUT_RULES.intercoolerDrop, input.intercoolerDropKpa ?? 0, "intercoolerDropKpa");
  const piping = requireQuantity(INPUT_RULES.pipingDrop, input.pipingDropKpa ?? 0, "pipingDropKpa");
  const inletKpa = station - filter;
  const manifoldKpa = station + boost;
  const outletKpa = manifoldKpa + cooler + piping;
  return { inletKpa, manifoldKpa, outletKpa, pressureRatio: outletKpa / inletKpa };
}
