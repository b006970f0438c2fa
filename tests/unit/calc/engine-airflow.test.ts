import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { unit } from "mathjs";
import {
  STANDARD_FLOW_REFERENCE,
  compressorPressureRatio,
  correctedAirFlow,
  engineAirMassFlowKgS,
  intakeVolumeGuideCc,
  type EngineAirflowInput,
} from "@/lib/calc";
import { expectRelClose, expectWithin, expectWorkshopError } from "./helpers";

const KPA_PER_PSI = 6.894757293168; // NIST SP 811 B.8
const LB_KG = 0.45359237; // NIST SP 811 B.8, exact

/** REFERENCE-CHECKS worked example: a litre four at its power peak. */
const litre: EngineAirflowInput = {
  displacementCc: 998,
  rpm: 11000,
  volumetricEfficiency: 0.95,
  manifoldPressureKpa: 170,
  manifoldTempK: 320,
};

describe("engineAirMassFlowKgS — Heywood ch. 2: ṁ = ηv · ρ · Vd · N/2, ρ = p/(R·T)", () => {
  it("998 cc, 11 000 rpm, ηv 0.95, 170 kPa, 320 K → 0.160845 kg/s (REFERENCE-CHECKS, calc with R = 287.05)", () => {
    // our R is 287.052 87 (ISO 2533); the check used 287.05: 1 part in 10⁵ apart
    expectWithin(engineAirMassFlowKgS(litre), 0.160845, 0.000005);
  });
  it("same point is 21.27 lb/min (REFERENCE-CHECKS; pound from NIST SP 811, and mathjs units agree)", () => {
    const kgS = engineAirMassFlowKgS(litre);
    expectWithin((kgS * 60) / LB_KG, 21.27, 0.01);
    expectRelClose(unit(kgS, "kg/s").toNumber("lb/min"), (kgS * 60) / LB_KG, 1e-12);
  });
  it("equals ηv × the mass of manifold air filling the displacement every two revolutions (independent form)", () => {
    // cylinders fill N/2 times per minute; each fill is Vd [m³] × ρ [kg/m³]
    const rho = 170_000 / (287.05287 * 320);
    const perCycleKg = 998e-6 * rho;
    expectRelClose(engineAirMassFlowKgS(litre), (0.95 * perCycleKg * 11000) / 2 / 60, 1e-12);
  });
  it("is proportional to rpm, VE and pressure, and inverse to temperature (ideal gas, property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 50, max: 2500, noNaN: true }),
        fc.double({ min: 500, max: 12000, noNaN: true }),
        fc.double({ min: 0.3, max: 0.7, noNaN: true }),
        fc.double({ min: 20, max: 300, noNaN: true }),
        fc.double({ min: 250, max: 400, noNaN: true }),
        (cc, rpm, ve, p, t) => {
          const base = engineAirMassFlowKgS({
            displacementCc: cc,
            rpm,
            volumetricEfficiency: ve,
            manifoldPressureKpa: p,
            manifoldTempK: t,
          });
          const doubled = engineAirMassFlowKgS({
            displacementCc: cc,
            rpm: rpm * 2,
            volumetricEfficiency: ve * 2,
            manifoldPressureKpa: p * 2,
            manifoldTempK: t,
          });
          return Math.abs(doubled / base - 8) < 1e-9;
        },
      ),
    );
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(() => engineAirMassFlowKgS({ ...litre, rpm: -5 }), "Engine speed", /got -5 rpm\.$/, "rpm");
    expectWorkshopError(
      () => engineAirMassFlowKgS({ ...litre, volumetricEfficiency: 95 }),
      "Volumetric efficiency",
      /0\.9 means 90 %/,
      "volumetricEfficiency",
    );
    expectWorkshopError(
      () => engineAirMassFlowKgS({ ...litre, manifoldPressureKpa: 0 }),
      "Manifold pressure (absolute)",
      /between 10 and 700 kPa/,
    );
    expectWorkshopError(
      () => engineAirMassFlowKgS({ ...litre, manifoldTempK: 47 }),
      "Manifold air temperature",
      /got 47 K \(-226\.15 °C\)/,
    );
    expectWorkshopError(
      () => engineAirMassFlowKgS({ ...litre, displacementCc: Number.NaN }),
      "Engine displacement (all cylinders)",
      /not a number/,
    );
  });
});

describe("correctedAirFlow — ṁ·√(T₁/T_ref)/(p₁/p_ref), default reference ISO 2533 sea level", () => {
  it("default reference is 101.325 kPa (29.92 inHg) and 288.15 K (15 °C / 59 °F), ISO 2533", () => {
    expect(STANDARD_FLOW_REFERENCE).toEqual({ pressureKpa: 101.325, temperatureK: 288.15 });
  });
  it("at the reference conditions the corrected flow is the actual flow", () => {
    const r = correctedAirFlow({ massFlowKgS: 0.160845, inletPressureKpa: 101.325, inletTempK: 288.15 });
    expect(r.kgS).toBe(0.160845);
    expectRelClose(r.lbMin, (0.160845 * 60) / LB_KG, 1e-14);
  });
  it("0.160845 kg/s drawn at 95 kPa, 30 °C corrects to 0.175962 kg/s = 23.28 lb/min (calc from the definition)", () => {
    const r = correctedAirFlow({ massFlowKgS: 0.160845, inletPressureKpa: 95, inletTempK: 303.15 });
    expectWithin(r.kgS, 0.160845 * Math.sqrt(303.15 / 288.15) * (101.325 / 95), 1e-12);
    expectWithin(r.kgS, 0.175962, 0.000001);
    expectWithin(r.lbMin, 23.28, 0.005);
  });
  it("uses the reference printed on the map when given", () => {
    const ref = { pressureKpa: 96.18, temperatureK: 302.6 };
    const r = correctedAirFlow({ massFlowKgS: 0.2, inletPressureKpa: 96.18, inletTempK: 302.6, reference: ref });
    expect(r.kgS).toBe(0.2);
    expect(r.reference).toEqual(ref);
  });
  it("thinner or hotter inlet air means more corrected flow for the same mass (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 2, noNaN: true }),
        fc.double({ min: 40, max: 105, noNaN: true }),
        fc.double({ min: 230, max: 330, noNaN: true }),
        (m, p, t) => {
          const a = correctedAirFlow({ massFlowKgS: m, inletPressureKpa: p, inletTempK: t }).kgS;
          return (
            correctedAirFlow({ massFlowKgS: m, inletPressureKpa: p - 5, inletTempK: t }).kgS > a &&
            correctedAirFlow({ massFlowKgS: m, inletPressureKpa: p, inletTempK: t + 5 }).kgS > a
          );
        },
      ),
    );
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(() => correctedAirFlow({ massFlowKgS: 0, inletPressureKpa: 100, inletTempK: 300 }), "Air mass flow", /more than 0/);
    expectWorkshopError(
      () => correctedAirFlow({ massFlowKgS: 0.1, inletPressureKpa: 170, inletTempK: 300 }),
      "Compressor inlet pressure (absolute)",
      /got 170 kPa/,
    );
    expectWorkshopError(
      () =>
        correctedAirFlow({ massFlowKgS: 0.1, inletPressureKpa: 100, inletTempK: 300, reference: { pressureKpa: 14.7, temperatureK: 288 } }),
      "Map reference pressure",
      /between 50 and 110 kPa; got 14\.7 kPa/,
      "reference.pressureKpa",
    );
  });
});

describe("compressorPressureRatio — (station + boost + intercooler + piping) / (station − filter)", () => {
  it("10 psi at sea level with no losses → PR 1.6805 (REFERENCE-CHECKS, calc)", () => {
    const r = compressorPressureRatio({ boostKpa: 10 * KPA_PER_PSI, stationPressureKpa: 101.325 });
    expectWithin(r.pressureRatio, 1.6805, 0.00005);
    expect(r.inletKpa).toBe(101.325);
  });
  it("losses before and after the compressor raise the ratio it must make (calc)", () => {
    const boost = 10 * KPA_PER_PSI;
    const r = compressorPressureRatio({
      boostKpa: boost,
      stationPressureKpa: 89.875,
      filterLossKpa: 1.5,
      intercoolerDropKpa: 6,
      pipingDropKpa: 2,
    });
    expectWithin(r.inletKpa, 88.375, 1e-12);
    expectWithin(r.manifoldKpa, 89.875 + boost, 1e-12);
    expectWithin(r.outletKpa, 89.875 + boost + 8, 1e-12);
    expectWithin(r.pressureRatio, (89.875 + boost + 8) / 88.375, 1e-12);
    // at 1 000 m the same gauge boost needs a higher ratio than at sea level
    expect(r.pressureRatio).toBeGreaterThan(1.6805);
  });
  it("every loss raises the ratio; the ratio never falls below 1 (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 300, noNaN: true }),
        fc.double({ min: 60, max: 105, noNaN: true }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        fc.double({ min: 0, max: 20, noNaN: true }),
        fc.double({ min: 0.1, max: 5, noNaN: true }),
        (boost, station, filter, cooler, more) => {
          const base = { boostKpa: boost, stationPressureKpa: station, filterLossKpa: filter, intercoolerDropKpa: cooler };
          const pr = compressorPressureRatio(base).pressureRatio;
          return (
            pr >= 1 &&
            compressorPressureRatio({ ...base, filterLossKpa: filter + more }).pressureRatio > pr &&
            compressorPressureRatio({ ...base, intercoolerDropKpa: cooler + more }).pressureRatio > pr &&
            compressorPressureRatio({ ...base, pipingDropKpa: more }).pressureRatio > pr
          );
        },
      ),
    );
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(
      () => compressorPressureRatio({ boostKpa: -10, stationPressureKpa: 100 }),
      "Boost (gauge, above the air pressure)",
      /between 0 and 600 kPa; got -10 kPa/,
    );
    expectWorkshopError(
      () => compressorPressureRatio({ boostKpa: 69, stationPressureKpa: 1013 }),
      "Air pressure at the engine (station pressure)",
      /got 1013 kPa/,
    );
    expectWorkshopError(
      () => compressorPressureRatio({ boostKpa: 69, stationPressureKpa: 100, filterLossKpa: -1 }),
      "Air filter pressure loss",
    );
    expectWorkshopError(
      () => compressorPressureRatio({ boostKpa: 69, stationPressureKpa: 100, intercoolerDropKpa: 80 }),
      "Intercooler pressure drop",
    );
    expectWorkshopError(
      () => compressorPressureRatio({ boostKpa: 69, stationPressureKpa: 100, pipingDropKpa: Infinity }),
      "Charge piping pressure drop",
      /too large/,
    );
  });
});

describe("intakeVolumeGuideCc — rule of thumb, common practice", () => {
  it("is ten times displacement and says it is the intake side before the compressor", () => {
    const g = intakeVolumeGuideCc(998);
    expect(g.volumeCc).toBe(9980);
    expect(g.basis).toMatch(/^Common practice/);
    expect(g.basis).toMatch(/before the compressor/);
    expect(g.caution).toMatch(/rule of thumb/);
  });
  it("refuses an impossible displacement", () => {
    expectWorkshopError(() => intakeVolumeGuideCc(0), "Engine displacement (all cylinders)", /between 20 and 10 000 cc; got 0 cc\./);
  });
});
