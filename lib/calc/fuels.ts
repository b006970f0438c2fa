/**
 * Fuels a tuner meets — petrol, E10, E85, methanol — with their stoichiometric air-fuel ratio and
 * density, ethanol blends worked out from their parts, and lambda ↔ air-fuel ratio.
 *
 * Lambda is the air-fuel ratio over the fuel's stoichiometric ratio: λ = AFR / AFR_stoich
 * (Heywood, *Internal Combustion Engine Fundamentals*, ch. 3). A wideband meter reads λ; the AFR it
 * shows depends on the fuel it is set for.
 */
import { INPUT_RULES } from "./input-rules";
import { formatNumber, requireChoice, requireQuantity } from "./quantity";

export interface FuelProperties {
  label: string;
  /** Mass of air per mass of fuel for complete combustion with no oxygen left. */
  stoichiometricAfr: number;
  /** Density at about 15–20 °C, kg/L. */
  densityKgPerL: number;
  /** Where the figures come from (and how sure they are). */
  source: string;
}

/** Petrol (gasoline) without ethanol. */
export const PETROL: Readonly<FuelProperties> = Object.freeze({
  label: "Petrol (no ethanol)",
  stoichiometricAfr: 14.7,
  densityKgPerL: 0.745,
  source:
    "AFR 14.7: common practice (the figure wideband meters use for petrol); Heywood, Internal Combustion Engine Fundamentals, app. D gives about 14.6 for a typical petrol (from memory). " +
    "Density 0.745 kg/L: middle of EN 228's 720–775 kg/m³ at 15 °C (from memory); each batch differs.",
});

/** Ethanol (C₂H₅OH), the alcohol in E10 and E85. */
export const ETHANOL: Readonly<FuelProperties> = Object.freeze({
  label: "Ethanol",
  stoichiometricAfr: 9.0,
  densityKgPerL: 0.789,
  source:
    "AFR 9.0: combustion stoichiometry of C₂H₅OH with air (Heywood ch. 3: 3 mol O₂ per mol, air O₂ + 3.773 N₂) gives 9.00. " +
    "Density 0.789 kg/L at 20 °C (CRC Handbook of Chemistry and Physics, from memory).",
});

/** Methanol (CH₃OH). */
export const METHANOL: Readonly<FuelProperties> = Object.freeze({
  label: "Methanol",
  stoichiometricAfr: 6.47,
  densityKgPerL: 0.791,
  source:
    "AFR 6.47: combustion stoichiometry of CH₃OH with air (Heywood ch. 3: 1.5 mol O₂ per mol, air O₂ + 3.773 N₂). " +
    "Density 0.791 kg/L at 20 °C (CRC Handbook of Chemistry and Physics, from memory).",
});

/**
 * Petrol with `ethanolPercentByVolume` % ethanol (0–100), from its parts:
 *   masses per litre m_p = (1 − x)·ρ_p, m_e = x·ρ_e; density = m_p + m_e (volumes taken as adding up,
 *   the small shrink on mixing ignored);
 *   AFR = (m_p·AFR_p + m_e·AFR_e) / (m_p + m_e) — the air each part needs adds up by mass.
 * Pump E85 holds less than 85 % ethanol in many seasons: use a flex-fuel sensor reading when there is one.
 */
export function ethanolBlend(ethanolPercentByVolume: number): FuelProperties {
  const pct = requireQuantity(INPUT_RULES.ethanolPercent, ethanolPercentByVolume, "ethanolPercentByVolume");
  const x = pct / 100;
  const mPetrol = (1 - x) * PETROL.densityKgPerL;
  const mEthanol = x * ETHANOL.densityKgPerL;
  const mass = mPetrol + mEthanol;
  return {
    label: `E${formatNumber(pct)} (${formatNumber(pct)} % ethanol by volume)`,
    stoichiometricAfr: (mPetrol * PETROL.stoichiometricAfr + mEthanol * ETHANOL.stoichiometricAfr) / mass,
    densityKgPerL: mass,
    source: `Worked out from petrol and ethanol by volume (${PETROL.label}: ${PETROL.stoichiometricAfr}, ${PETROL.densityKgPerL} kg/L; ethanol: ${ETHANOL.stoichiometricAfr}, ${ETHANOL.densityKgPerL} kg/L).`,
  };
}

export const FUEL_IDS = ["petrol", "E10", "E85", "methanol"] as const;
export type FuelId = (typeof FUEL_IDS)[number];

/** The fuels offered by name. E10 and E85 are {@link ethanolBlend} at 10 % and 85 %. */
export const FUELS: Readonly<Record<FuelId, Readonly<FuelProperties>>> = Object.freeze({
  petrol: PETROL,
  E10: Object.freeze(ethanolBlend(10)),
  E85: Object.freeze(ethanolBlend(85)),
  methanol: METHANOL,
});

/** The fuel's figures by id ("petrol", "E10", "E85", "methanol"). */
export function fuelProperties(fuel: FuelId): Readonly<FuelProperties> {
  return FUELS[requireChoice("Fuel", fuel, FUEL_IDS, "fuel")];
}

/** Air-fuel ratio from lambda: AFR = λ · AFR_stoich (λ 0.4–3, AFR_stoich 1.5–20). */
export function lambdaToAfr(lambda: number, stoichiometricAfr: number): number {
  const l = requireQuantity(INPUT_RULES.lambda, lambda, "lambda");
  return l * requireQuantity(INPUT_RULES.stoichiometricAfr, stoichiometricAfr, "stoichiometricAfr");
}

/** Lambda from an air-fuel ratio: λ = AFR / AFR_stoich (AFR 1–50, AFR_stoich 1.5–20). */
export function afrToLambda(airFuelRatio: number, stoichiometricAfr: number): number {
  const afr = requireQuantity(INPUT_RULES.airFuelRatio, airFuelRatio, "airFuelRatio");
  return afr / requireQuantity(INPUT_RULES.stoichiometricAfr, stoichiometricAfr, "stoichiometricAfr");
}
