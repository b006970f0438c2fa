import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  chargeDensityKgM3,
  compressorOutletTemperatureK,
  intercoolerEffectiveness,
  intercoolerOutletTemperatureK,
  pressureRatioFromBoost,
} from "@/lib/calc";
import { expectCalcError, expectWithin } from "./helpers";

const KPA_PER_PSI = 6.894757293168; // NIST SP 811 B.8

describe("compressorOutletTemperatureK — NASA Glenn compressor thermodynamics: T2 = T1·[1 + (PR^((γ−1)/γ) − 1)/η]", () => {
  it("298.15 K, PR 2.0, η 0.75 → 385.215 K (REFERENCE-CHECKS, calc)", () => {
    expectWithin(compressorOutletTemperatureK(298.15, 2, 0.75), 385.215, 0.0005);
  });
  it("20 °C, 10 psi boost (PR 1.6805), η 0.72 → 85.09 °C (REFERENCE-CHECKS, calc)", () => {
    const pr = pressureRatioFromBoost(10 * KPA_PER_PSI);
    expectWithin(pr, 1.6805, 0.00005);
    expectWithin(compressorOutletTemperatureK(293.15, pr, 0.72) - 273.15, 85.09, 0.005);
  });
  it("η = 1 gives the isentropic temperature (NASA Glenn: T2/T1 = PR^((γ−1)/γ))", () => {
    expectWithin(compressorOutletTemperatureK(300, 2, 1), 300 * 2 ** (0.4 / 1.4), 1e-9);
  });
  it("lower efficiency always means a hotter outlet (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 200, max: 350, noNaN: true }),
        fc.double({ min: 1.01, max: 4, noNaN: true }),
        fc.double({ min: 0.3, max: 0.99, noNaN: true }),
        (t1, pr, eta) => compressorOutletTemperatureK(t1, pr, eta) > compressorOutletTemperatureK(t1, pr, eta + 0.01),
      ),
    );
  });
  it("throws CalcInputError for impossible input", () => {
    expectCalcError(() => compressorOutletTemperatureK(298, 2, 0), "efficiency", /\(0, 1\]/);
    expectCalcError(() => compressorOutletTemperatureK(298, 2, 1.2), "efficiency", /got 1.2/);
    expectCalcError(() => compressorOutletTemperatureK(0, 2, 0.7), "inletK");
    expectCalcError(() => compressorOutletTemperatureK(298, 0.9, 0.7), "pressureRatio", /≥ 1/);
    expectCalcError(() => compressorOutletTemperatureK(298, 2, 0.7, 1), "gamma", /> 1/);
    expectCalcError(() => pressureRatioFromBoost(-150), "boostKpa");
  });
});

describe("intercooler effectiveness ε = (Tin − Tout)/(Tin − Tamb)", () => {
  it("25, 22, 20 °C → 0.60 (published page)", () => {
    expectWithin(intercoolerEffectiveness(25, 22, 20), 0.6, 1e-12);
  });
  it("112.07 °C in, ε 0.75, ambient 25 °C → 46.77 °C out (REFERENCE-CHECKS, calc)", () => {
    expectWithin(intercoolerOutletTemperatureK(112.07 + 273.15, 25 + 273.15, 0.75) - 273.15, 46.77, 0.005);
  });
  it("the outlet lies between ambient and inlet (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 300, max: 500, noNaN: true }),
        fc.double({ min: 250, max: 300, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (hot, amb, eps) => {
          const out = intercoolerOutletTemperatureK(hot, amb, eps);
          return out <= hot + 1e-9 && out >= amb - 1e-9;
        },
      ),
    );
  });
  it("throws CalcInputError for impossible input", () => {
    expectCalcError(() => intercoolerOutletTemperatureK(380, 298, 1.5), "effectiveness");
    expectCalcError(() => intercoolerOutletTemperatureK(-1, 298, 0.5), "hotInK");
    expectCalcError(() => intercoolerOutletTemperatureK(380, 0, 0.5), "ambientK");
    expectCalcError(() => intercoolerEffectiveness(20, 18, 20), "hotIn", /differ/);
  });
});

describe("chargeDensityKgM3 — dry air ideal gas, R = 287.052 87 J/(kg·K)", () => {
  it("ISO 2533 standard atmosphere: 101 325 Pa, 288.15 K → 1.225 kg/m³", () => {
    expectWithin(chargeDensityKgM3(101.325, 288.15), 1.225, 0.000005);
  });
  it("density scales with pressure and inversely with temperature (ideal gas, property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 50, max: 400, noNaN: true }),
        fc.double({ min: 230, max: 450, noNaN: true }),
        (p, t) => Math.abs(chargeDensityKgM3(2 * p, t) / chargeDensityKgM3(p, 2 * t) - 4) < 1e-12,
      ),
    );
  });
  it("throws CalcInputError for impossible input", () => {
    expectCalcError(() => chargeDensityKgM3(0, 288), "pressureKpa");
    expectCalcError(() => chargeDensityKgM3(101, -5), "temperatureK", /got -5/);
    expect(() => chargeDensityKgM3(101, Number.NaN)).toThrow(/temperatureK/);
  });
});
