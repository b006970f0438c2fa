/**
 * Injector size, duty cycle, fuel pressure under boost and fuel pump flow for a boosted build.
 * Flows in cc/min per injector unless named otherwise; pressures in kPa.
 */
import { CalcInputError, requireObject } from "./errors";
import { INPUT_RULES } from "./input-rules";
import { requireQuantity, withUnit } from "./quantity";
import { KG_PER_POUND, KW_PER_HP } from "./units";

/** g/kWh in one lb/(hp·h): 453.592 37 g / 0.745 699 87 kWh ≈ 608.277 (NIST SP 811 pound and horsepower). */
export const G_PER_KWH_PER_LB_PER_HP_H = (KG_PER_POUND * 1000) / KW_PER_HP;

/** BSFC in g/kWh from the trade's lb/(hp·h). */
export function bsfcGPerKwhFromLbPerHpH(lbPerHpH: number): number {
  return (
    requireQuantity({ label: "Brake specific fuel consumption (BSFC)", unit: "lb/hp·h", min: 0.2, max: 1.7 }, lbPerHpH, "lbPerHpH") *
    G_PER_KWH_PER_LB_PER_HP_H
  );
}

/** BSFC figures to start from when the engine's own are not known. Common practice, not measurements. */
export const BSFC_GUIDES = Object.freeze({
  boostedPetrol: Object.freeze({
    label: "Boosted petrol engine",
    minLbPerHpH: 0.6,
    maxLbPerHpH: 0.65,
    /** The figure offered first: 380 g/kWh ≈ 0.625 lb/(hp·h), the middle of the range. */
    suggestedGPerKwh: 380,
    basis: "Common practice: 0.60–0.65 lb/(hp·h) (about 365–395 g/kWh) for a boosted petrol engine at full load.",
  }),
});

export interface InjectorSizeInput {
  /** Target power at the crank, kW. */
  powerKw: number;
  /** Brake specific fuel consumption at that power, g/kWh (150–1000). */
  bsfcGPerKwh: number;
  /** Number of injectors sharing the fuel (whole number, 1–32). */
  injectors: number;
  /** Highest duty cycle to plan for, fraction (e.g. 0.8). */
  maxDuty: number;
  /** Fuel density, kg/L (see `FUELS`). */
  fuelDensityKgPerL: number;
}

/**
 * Injector flow needed per injector, cc/min (BSFC method, common practice):
 *   fuel = P · BSFC [g/h] → ÷ (ρ · 1000) [L/h] → × 1000 / 60 [cc/min] → ÷ injectors ÷ duty
 *   = P · BSFC / (60 · ρ · n · duty).
 * The flow is at the fuel pressure the injector will see (compare with a rated flow through
 * {@link injectorFlowAtPressure}).
 */
export function requiredInjectorFlowCcMin(input: InjectorSizeInput): number {
  requireObject("input", input);
  const p = requireQuantity(INPUT_RULES.power, input.powerKw, "powerKw");
  const bsfc = requireQuantity(INPUT_RULES.bsfc, input.bsfcGPerKwh, "bsfcGPerKwh");
  const n = requireQuantity(INPUT_RULES.injectors, input.injectors, "injectors");
  const duty = requireQuantity(INPUT_RULES.maxDuty, input.maxDuty, "maxDuty");
  const rho = requireQuantity(INPUT_RULES.fuelDensity, input.fuelDensityKgPerL, "fuelDensityKgPerL");
  return (p * bsfc) / (60 * rho * n * duty);
}

export interface InjectorFromAirflowInput {
  /** Air mass flow at the target, kg/s (e.g. from `engineAirMassFlowKgS`). */
  airMassFlowKgS: number;
  /** Lambda aimed for at that point (e.g. 0.78 under boost). */
  lambda: number;
  /** Stoichiometric air-fuel ratio of the fuel (see `FUELS`). */
  stoichiometricAfr: number;
  injectors: number;
  maxDuty: number;
  fuelDensityKgPerL: number;
}

/**
 * Injector flow needed per injector, cc/min, from the air the engine takes and the lambda aimed for:
 *   fuel [kg/s] = air / (λ · AFR_stoich) → ÷ ρ [L/s] → × 60 000 [cc/min] → ÷ injectors ÷ duty.
 */
export function injectorFlowForAirflowCcMin(input: InjectorFromAirflowInput): number {
  requireObject("input", input);
  const air = requireQuantity(INPUT_RULES.airMassFlow, input.airMassFlowKgS, "airMassFlowKgS");
  const lambda = requireQuantity(INPUT_RULES.lambda, input.lambda, "lambda");
  const afr = requireQuantity(INPUT_RULES.stoichiometricAfr, input.stoichiometricAfr, "stoichiometricAfr");
  const n = requireQuantity(INPUT_RULES.injectors, input.injectors, "injectors");
  const duty = requireQuantity(INPUT_RULES.maxDuty, input.maxDuty, "maxDuty");
  const rho = requireQuantity(INPUT_RULES.fuelDensity, input.fuelDensityKgPerL, "fuelDensityKgPerL");
  const fuelKgS = air / (lambda * afr);
  return ((fuelKgS / rho) * 60000) / (n * duty);
}

/**
 * Injector flow at another fuel pressure (orifice flow, Bernoulli): Q₂ = Q₁ · √(p₂ / p₁).
 * Pressures are across the injector (rail minus manifold), kPa (20–1000); flows cc/min.
 */
export function injectorFlowAtPressure(ratedFlowCcMin: number, ratedPressureKpa: number, actualPressureKpa: number): number {
  const q1 = requireQuantity(INPUT_RULES.injectorFlow, ratedFlowCcMin, "ratedFlowCcMin");
  const p1 = requireQuantity(INPUT_RULES.ratedFuelPressure, ratedPressureKpa, "ratedPressureKpa");
  const p2 = requireQuantity(INPUT_RULES.fuelPressureAcrossInjector, actualPressureKpa, "actualPressureKpa");
  return q1 * Math.sqrt(p2 / p1);
}

/**
 * Duty cycle (fraction of the time the injector is open) to deliver `requiredFlowCcMin` from an
 * injector that flows `injectorFlowCcMin` held open, both at the same fuel pressure:
 *   duty = required / injector flow.
 * Above 1 the injector cannot deliver it; above about 0.8–0.85 it has no room left (common practice).
 */
export function injectorDutyCycle(requiredFlowCcMin: number, injectorFlowCcMin: number): number {
  const need = requireQuantity(INPUT_RULES.requiredFlow, requiredFlowCcMin, "requiredFlowCcMin");
  return need / requireQuantity(INPUT_RULES.injectorFlow, injectorFlowCcMin, "injectorFlowCcMin");
}

/**
 * Duty cycle of a four-stroke injector from its pulse width: one opening per cycle of two
 * revolutions, which lasts 120 000 / rpm ms, so duty = pulse width · rpm / 120 000
 * (the trade's "PW × rpm / 1200" in %; common practice). May exceed 1 (static: the injector cannot keep up).
 */
export function injectorDutyFromPulseWidth(pulseWidthMs: number, rpm: number): number {
  const pw = requireQuantity(INPUT_RULES.pulseWidth, pulseWidthMs, "pulseWidthMs");
  return (pw * requireQuantity(INPUT_RULES.engineSpeed, rpm, "rpm")) / 120000;
}

export interface FuelPressureInput {
  /** Base fuel pressure, kPa gauge, set with the regulator's manifold reference open to air. */
  basePressureKpa: number;
  /** Manifold pressure above the air pressure, kPa (boost; negative for vacuum). */
  boostKpa: number;
  /**
   * kPa of fuel pressure added per kPa of boost: 1 for a boost-referenced (1:1) regulator (default),
   * more than 1 for a rising-rate regulator, 0 for a fixed, unreferenced one.
   */
  riseRatio?: number;
}

export interface FuelPressureUnderBoost {
  /** Fuel rail pressure above the air pressure (what a gauge on the rail shows), kPa. */
  railGaugeKpa: number;
  /** Rail minus manifold: the pressure that drives fuel through the injector, kPa. */
  acrossInjectorKpa: number;
}

/**
 * Fuel pressure with boost: rail = base + riseRatio · boost; across the injector = rail − boost
 * = base + (riseRatio − 1) · boost. With a 1:1 boost-referenced regulator the pressure across the
 * injector stays at base, so the injector flows its base-pressure flow at any boost.
 * Throws when the boost would leave no pressure across the injector (fixed regulator, high boost).
 */
export function fuelPressureUnderBoost(input: FuelPressureInput): FuelPressureUnderBoost {
  requireObject("input", input);
  const base = requireQuantity(INPUT_RULES.baseFuelPressure, input.basePressureKpa, "basePressureKpa");
  const boost = requireQuantity(INPUT_RULES.boostOrVacuum, input.boostKpa, "boostKpa");
  const ratio = requireQuantity(INPUT_RULES.regulatorRiseRatio, input.riseRatio ?? 1, "riseRatio");
  const railGaugeKpa = base + ratio * boost;
  const acrossInjectorKpa = railGaugeKpa - boost;
  if (!(acrossInjectorKpa > 0)) {
    throw new CalcInputError(
      "Boost",
      boost,
      `must stay below the fuel pressure across the injector; with ${withUnit(base, "kPa")} base pressure rising ${withUnit(ratio, "")} per kPa of boost, no fuel would flow`,
      { shown: `${withUnit(boost, "kPa")}.`, field: "boostKpa" },
    );
  }
  return { railGaugeKpa, acrossInjectorKpa };
}

export interface FuelPumpInput {
  /** Target power at the crank, kW. */
  powerKw: number;
  /** BSFC at that power, g/kWh. */
  bsfcGPerKwh: number;
  fuelDensityKgPerL: number;
  /** Base fuel pressure, kPa gauge. */
  basePressureKpa: number;
  /** Boost at that power, kPa gauge (the pump must deliver against rail pressure at this boost). */
  boostKpa: number;
  /** As in {@link FuelPressureInput}; default 1 (boost-referenced 1:1). */
  riseRatio?: number;
  /** Extra flow on top of what the engine burns, fraction (e.g. 0.25 for 25 %); default 0. */
  marginFraction?: number;
}

export interface FuelPumpNeed {
  /** Flow the pump must deliver, L/h (what the engine burns × (1 + margin)). */
  flowLh: number;
  /** At this pressure above the air pressure (rail pressure at full boost), kPa; read the pump's chart here. */
  pressureKpa: number;
  /** What the engine burns at the target, kg/h. */
  fuelKgH: number;
}

/**
 * Fuel pump flow needed: fuel [kg/h] = P · BSFC / 1000; flow [L/h] = fuel / ρ · (1 + margin),
 * at the rail pressure under boost from {@link fuelPressureUnderBoost}. The pump's published flow
 * at that pressure (its flow-against-pressure chart, at the voltage it will see) must reach it.
 */
export function fuelPumpFlowNeeded(input: FuelPumpInput): FuelPumpNeed {
  requireObject("input", input);
  const p = requireQuantity(INPUT_RULES.power, input.powerKw, "powerKw");
  const bsfc = requireQuantity(INPUT_RULES.bsfc, input.bsfcGPerKwh, "bsfcGPerKwh");
  const rho = requireQuantity(INPUT_RULES.fuelDensity, input.fuelDensityKgPerL, "fuelDensityKgPerL");
  const margin = requireQuantity(INPUT_RULES.pumpMargin, input.marginFraction ?? 0, "marginFraction");
  const { railGaugeKpa } = fuelPressureUnderBoost({
    basePressureKpa: input.basePressureKpa,
    boostKpa: input.boostKpa,
    riseRatio: input.riseRatio,
  });
  const fuelKgH = (p * bsfc) / 1000;
  return { flowLh: (fuelKgH / rho) * (1 + margin), pressureKpa: railGaugeKpa, fuelKgH };
}
