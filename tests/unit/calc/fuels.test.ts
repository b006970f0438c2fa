import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  ETHANOL,
  FUELS,
  FUEL_IDS,
  METHANOL,
  PETROL,
  afrToLambda,
  ethanolBlend,
  fuelProperties,
  lambdaToAfr,
  type FuelId,
} from "@/lib/calc";
import { expectRelClose, expectWithin, expectWorkshopError } from "./helpers";

// Stoichiometric AFR of CxHyOz from its combustion equation (Heywood, ICE Fundamentals, ch. 3):
// CxHyOz + (x + y/4 − z/2)(O2 + 3.773 N2) → x CO2 + y/2 H2O + …; air per mol O2 = 32.00 + 3.773 × 28.16
// ("atmospheric nitrogen", Heywood) = 138.25 g. Atomic weights (IUPAC, conventional): C 12.011, H 1.008, O 15.999.
const AIR_PER_MOL_O2 = 31.998 + 3.773 * 28.16;
const stoich = (x: number, y: number, z: number) => ((x + y / 4 - z / 2) * AIR_PER_MOL_O2) / (12.011 * x + 1.008 * y + 15.999 * z);

describe("fuels — stoichiometric air-fuel ratio and density", () => {
  it("ethanol C₂H₅OH: 9.0 matches its combustion equation (Heywood ch. 3) to 0.01", () => {
    expectWithin(ETHANOL.stoichiometricAfr, stoich(2, 6, 1), 0.01);
  });
  it("methanol CH₃OH: 6.47 matches its combustion equation (Heywood ch. 3) to 0.01", () => {
    expectWithin(METHANOL.stoichiometricAfr, stoich(1, 4, 1), 0.01);
  });
  it("petrol 14.7 is the trade's figure (common practice); a CH1.87 petrol (Heywood, from memory) gives 14.6", () => {
    expect(PETROL.stoichiometricAfr).toBe(14.7);
    expectWithin(stoich(1, 1.87, 0), 14.6, 0.05);
    expectWithin(PETROL.stoichiometricAfr, stoich(1, 1.87, 0), 0.15);
  });
  it("densities: petrol inside EN 228's 720–775 kg/m³ (from memory); alcohols as CRC lists at 20 °C (from memory)", () => {
    expect(PETROL.densityKgPerL).toBeGreaterThanOrEqual(0.72);
    expect(PETROL.densityKgPerL).toBeLessThanOrEqual(0.775);
    expectWithin(ETHANOL.densityKgPerL, 0.7893, 0.001);
    expectWithin(METHANOL.densityKgPerL, 0.7914, 0.001);
  });
  it("E10 ≈ 14.1 and E85 ≈ 9.8 (common practice), worked out from the parts by mass", () => {
    // by hand: per litre of E85, 0.15 L petrol and 0.85 L ethanol; air demand adds by mass
    const mp = 0.15 * 0.745;
    const me = 0.85 * 0.789;
    expectRelClose(FUELS.E85.stoichiometricAfr, (mp * 14.7 + me * 9.0) / (mp + me), 1e-12);
    expectRelClose(FUELS.E85.densityKgPerL, mp + me, 1e-12);
    expectWithin(FUELS.E10.stoichiometricAfr, 14.1, 0.05);
    expectWithin(FUELS.E85.stoichiometricAfr, 9.8, 0.1);
  });
  it("blends run from petrol at 0 % to ethanol at 100 %, AFR falling as ethanol rises (property)", () => {
    expectRelClose(ethanolBlend(0).stoichiometricAfr, PETROL.stoichiometricAfr, 1e-15);
    expectRelClose(ethanolBlend(100).stoichiometricAfr, ETHANOL.stoichiometricAfr, 1e-15);
    fc.assert(
      fc.property(fc.double({ min: 0, max: 99, noNaN: true }), fc.double({ min: 0.01, max: 1, noNaN: true }), (pct, more) => {
        return ethanolBlend(pct + more).stoichiometricAfr < ethanolBlend(pct).stoichiometricAfr;
      }),
    );
  });
  it("every fuel names its source, and says 'from memory' or 'common practice' where it is", () => {
    for (const id of FUEL_IDS) {
      const f = fuelProperties(id);
      expect(f.source.length, id).toBeGreaterThan(20);
    }
    expect(PETROL.source).toMatch(/common practice/);
    expect(PETROL.source).toMatch(/from memory/);
  });
  it("refuses an unknown fuel and an impossible blend", () => {
    expectWorkshopError(
      () => fuelProperties("diesel" as FuelId),
      "Fuel",
      /^Fuel must be one of petrol, E10, E85, methanol; got "diesel"\.$/,
      "fuel",
    );
    expectWorkshopError(() => fuelProperties(undefined as unknown as FuelId), "Fuel", /got nothing usable\.$/);
    expectWorkshopError(() => ethanolBlend(110), "Ethanol content", /between 0 and 100 % by volume; got 110 % by volume\./);
  });
});

describe("lambda ↔ air-fuel ratio — λ = AFR / AFR_stoich (Heywood ch. 3)", () => {
  it("λ 1 is the stoichiometric ratio; λ 0.8 on petrol is 11.76:1 (calc)", () => {
    expect(lambdaToAfr(1, 14.7)).toBe(14.7);
    expectWithin(lambdaToAfr(0.8, 14.7), 11.76, 1e-12);
    expectWithin(afrToLambda(11.76, 14.7), 0.8, 1e-12);
  });
  it("the same λ reads as a different AFR on E85 and methanol", () => {
    expectWithin(lambdaToAfr(0.8, FUELS.E85.stoichiometricAfr), 0.8 * FUELS.E85.stoichiometricAfr, 1e-12);
    expectWithin(lambdaToAfr(0.8, METHANOL.stoichiometricAfr), 5.176, 1e-9);
  });
  it("round trip returns λ (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 1.5, noNaN: true }), fc.constantFrom(...FUEL_IDS), (l, id) => {
        const afr = lambdaToAfr(l, FUELS[id].stoichiometricAfr);
        return Math.abs(afrToLambda(afr, FUELS[id].stoichiometricAfr) - l) < 1e-12;
      }),
    );
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(() => lambdaToAfr(12.5, 14.7), "Lambda", /between 0\.4 and 3; got 12\.5\./, "lambda");
    expectWorkshopError(() => afrToLambda(0, 14.7), "Air-fuel ratio", /between 1 and 50 .*; got 0\./);
    expectWorkshopError(() => afrToLambda(12, 0), "Stoichiometric air-fuel ratio of the fuel", /got 0\./);
  });
});
