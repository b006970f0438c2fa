import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  BSFC_GUIDES,
  FUELS,
  bsfcGPerKwhFromLbPerHpH,
  engineAirMassFlowKgS,
  fuelPressureUnderBoost,
  fuelPumpFlowNeeded,
  injectorDutyCycle,
  injectorDutyFromPulseWidth,
  injectorFlowAtPressure,
  injectorFlowForAirflowCcMin,
  requiredInjectorFlowCcMin,
} from "@/lib/calc";
import { expectRelClose, expectWithin, expectWorkshopError } from "./helpers";

const LB_G = 453.59237; // NIST SP 811 B.8, exact
const HP_KW = 0.74569987158227; // NIST SP 811 B.8 (550 ft·lbf/s)
const KPA_PER_PSI = 6.894757293168; // NIST SP 811 B.8

describe("requiredInjectorFlowCcMin — BSFC method (common practice)", () => {
  it("190 kW, 300 g/kWh, 4 injectors, 80 % duty, petrol 0.74 kg/L → 401.18 cc/min (REFERENCE-CHECKS, calc)", () => {
    expectWithin(
      requiredInjectorFlowCcMin({ powerKw: 190, bsfcGPerKwh: 300, injectors: 4, maxDuty: 0.8, fuelDensityKgPerL: 0.74 }),
      401.18,
      0.005,
    );
  });
  it("agrees with the US form lb/hr = hp · BSFC / (n · duty): 200 hp, 0.60, 4, 0.8 → 37.5 lb/hr (REFERENCE-CHECKS, calc)", () => {
    const lbHr = (200 * 0.6) / (4 * 0.8);
    expect(lbHr).toBe(37.5);
    const ccMin = requiredInjectorFlowCcMin({
      powerKw: 200 * HP_KW,
      bsfcGPerKwh: bsfcGPerKwhFromLbPerHpH(0.6),
      injectors: 4,
      maxDuty: 0.8,
      fuelDensityKgPerL: 0.74,
    });
    // 37.5 lb/hr of fuel at 0.74 g/cc, per minute
    expectRelClose(ccMin, (37.5 * LB_G) / 0.74 / 60, 1e-12);
  });
  it("the boosted-petrol BSFC offered first is 380 g/kWh, inside the common-practice 0.60–0.65 lb/(hp·h)", () => {
    const g = BSFC_GUIDES.boostedPetrol;
    expect(g.basis).toMatch(/^Common practice/);
    expect(g.suggestedGPerKwh).toBeGreaterThanOrEqual(bsfcGPerKwhFromLbPerHpH(g.minLbPerHpH));
    expect(g.suggestedGPerKwh).toBeLessThanOrEqual(bsfcGPerKwhFromLbPerHpH(g.maxLbPerHpH));
    expectWithin(bsfcGPerKwhFromLbPerHpH(1), LB_G / HP_KW, 1e-9); // 608.277 g/kWh per lb/(hp·h)
  });
  it("scales with power and inversely with injectors and duty (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 5, max: 1000, noNaN: true }),
        fc.double({ min: 200, max: 700, noNaN: true }),
        fc.integer({ min: 1, max: 16 }),
        fc.double({ min: 0.2, max: 0.5, noNaN: true }),
        (kw, bsfc, n, duty) => {
          const base = { powerKw: kw, bsfcGPerKwh: bsfc, injectors: n, maxDuty: duty, fuelDensityKgPerL: 0.745 };
          const a = requiredInjectorFlowCcMin(base);
          const b = requiredInjectorFlowCcMin({ ...base, powerKw: kw * 2, injectors: n * 2, maxDuty: duty * 2 });
          return Math.abs(b / a - 0.5) < 1e-12;
        },
      ),
    );
  });
  it("refuses impossible input in workshop words", () => {
    const ok = { powerKw: 190, bsfcGPerKwh: 380, injectors: 4, maxDuty: 0.8, fuelDensityKgPerL: 0.745 };
    expectWorkshopError(
      () => requiredInjectorFlowCcMin({ ...ok, injectors: 0 }),
      "Number of injectors",
      /whole number from 1 to 32; got 0\./,
    );
    expectWorkshopError(
      () => requiredInjectorFlowCcMin({ ...ok, maxDuty: 80 }),
      "Highest injector duty cycle",
      /0\.8 means 80 %\); got 80\./,
    );
    expectWorkshopError(
      () => requiredInjectorFlowCcMin({ ...ok, bsfcGPerKwh: 0.62 }),
      "Brake specific fuel consumption (BSFC)",
      /between 150 and 1000 g\/kWh; got 0\.62 g\/kWh\./,
    );
    expectWorkshopError(() => requiredInjectorFlowCcMin({ ...ok, fuelDensityKgPerL: 745 }), "Fuel density", /got 745 kg\/L/);
    expectWorkshopError(
      () => requiredInjectorFlowCcMin({ ...ok, powerKw: -1 }),
      "Target power",
      /more than 0 and at most 3000 kW; got -1 kW\./,
    );
  });
});

describe("injectorFlowForAirflowCcMin — fuel = air / (λ · AFR_stoich)", () => {
  it("0.160845 kg/s of air at λ 0.8 on petrol over 4 injectors at 80 % (calc)", () => {
    const fuelKgS = 0.160845 / (0.8 * 14.7);
    const expected = ((fuelKgS / 0.745) * 1000 * 60) / 4 / 0.8;
    expectRelClose(
      injectorFlowForAirflowCcMin({
        airMassFlowKgS: 0.160845,
        lambda: 0.8,
        stoichiometricAfr: 14.7,
        injectors: 4,
        maxDuty: 0.8,
        fuelDensityKgPerL: 0.745,
      }),
      expected,
      1e-12,
    );
  });
  it("E85 needs about 43 % more injector than petrol for the same air and λ (calc from the two fuels' AFR and density)", () => {
    const air = engineAirMassFlowKgS({
      displacementCc: 998,
      rpm: 11000,
      volumetricEfficiency: 0.95,
      manifoldPressureKpa: 170,
      manifoldTempK: 320,
    });
    const on = (fuel: "petrol" | "E85") =>
      injectorFlowForAirflowCcMin({
        airMassFlowKgS: air,
        lambda: 0.8,
        stoichiometricAfr: FUELS[fuel].stoichiometricAfr,
        injectors: 4,
        maxDuty: 0.8,
        fuelDensityKgPerL: FUELS[fuel].densityKgPerL,
      });
    const ratio = on("E85") / on("petrol");
    expectRelClose(ratio, (14.7 * 0.745) / (FUELS.E85.stoichiometricAfr * FUELS.E85.densityKgPerL), 1e-12);
    expectWithin(ratio, 1.43, 0.01);
  });
});

describe("injectorFlowAtPressure — orifice flow Q₂ = Q₁·√(p₂/p₁)", () => {
  it("440 cc/min rated at 300 kPa, run at 369 kPa → 487.98 cc/min (REFERENCE-CHECKS, calc)", () => {
    expectWithin(injectorFlowAtPressure(440, 300, 369), 487.98, 0.005);
  });
  it("four times the pressure doubles the flow (Bernoulli)", () => {
    expectRelClose(injectorFlowAtPressure(440, 250, 1000), 880, 1e-15);
  });
  it("is monotone in pressure (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 50, max: 2000, noNaN: true }),
        fc.double({ min: 100, max: 600, noNaN: true }),
        fc.double({ min: 20, max: 900, noNaN: true }),
        fc.double({ min: 0.1, max: 99, noNaN: true }),
        (q, rated, p, more) => injectorFlowAtPressure(q, rated, p + more) > injectorFlowAtPressure(q, rated, p),
      ),
    );
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(() => injectorFlowAtPressure(0, 300, 300), "Injector flow", /more than 0/, "ratedFlowCcMin");
    expectWorkshopError(() => injectorFlowAtPressure(440, 3, 300), "Injector rated fuel pressure", /between 20 and 1000 kPa; got 3 kPa\./);
    expectWorkshopError(() => injectorFlowAtPressure(440, 300, -43.5), "Fuel pressure across the injector", /got -43\.5 kPa/);
  });
});

describe("duty cycle", () => {
  it("400 cc/min needed of a 500 cc/min injector → 0.8", () => {
    expectWithin(injectorDutyCycle(400, 500), 0.8, 1e-15);
    expect(injectorDutyCycle(600, 500)).toBeGreaterThan(1); // cannot deliver: shown, not hidden
  });
  it("pulse width: 10 ms at 6 000 rpm is 50 % (PW × rpm / 1200 in %, common practice; one opening per 2 revolutions)", () => {
    expectWithin(injectorDutyFromPulseWidth(10, 6000), (10 * 6000) / 1200 / 100, 1e-15);
    expectWithin(injectorDutyFromPulseWidth(10, 6000), 10 / (2 * (60000 / 6000)), 1e-15); // cycle = 2 revolutions of 10 ms
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(() => injectorDutyCycle(-1, 500), "Fuel flow needed per injector", /got -1 cc\/min/);
    expectWorkshopError(() => injectorDutyFromPulseWidth(-2, 6000), "Injector pulse width", /between 0 and 1000 ms; got -2 ms\./);
  });
});

describe("fuelPressureUnderBoost — rail = base + ratio·boost, across the injector = rail − boost", () => {
  const boost = 10 * KPA_PER_PSI;
  it("a 1:1 boost-referenced regulator keeps the pressure across the injector at base", () => {
    const r = fuelPressureUnderBoost({ basePressureKpa: 300, boostKpa: boost });
    expectWithin(r.railGaugeKpa, 300 + boost, 1e-12);
    expectWithin(r.acrossInjectorKpa, 300, 1e-12);
  });
  it("a fixed regulator loses the boost across the injector, and the injector flows less (calc)", () => {
    const r = fuelPressureUnderBoost({ basePressureKpa: 300, boostKpa: boost, riseRatio: 0 });
    expect(r.railGaugeKpa).toBe(300);
    expectWithin(r.acrossInjectorKpa, 300 - boost, 1e-12);
    expectWithin(injectorFlowAtPressure(440, 300, r.acrossInjectorKpa), 440 * Math.sqrt((300 - boost) / 300), 1e-9);
  });
  it("a rising-rate regulator (2:1) adds pressure across the injector; vacuum lowers the rail", () => {
    expectWithin(fuelPressureUnderBoost({ basePressureKpa: 300, boostKpa: boost, riseRatio: 2 }).acrossInjectorKpa, 300 + boost, 1e-12);
    expectWithin(fuelPressureUnderBoost({ basePressureKpa: 300, boostKpa: -60 }).railGaugeKpa, 240, 1e-12);
  });
  it("refuses a boost that would stop the fuel, in workshop words", () => {
    expectWorkshopError(
      () => fuelPressureUnderBoost({ basePressureKpa: 250, boostKpa: 300, riseRatio: 0 }),
      "Boost",
      /must stay below the fuel pressure across the injector; .*no fuel would flow; got 300 kPa\./,
      "boostKpa",
    );
  });
});

describe("fuelPumpFlowNeeded — L/h at the rail pressure under boost", () => {
  it("190 kW at 300 g/kWh on 0.74 kg/L with 25 % margin → 96.28 L/h at 300 kPa + boost (calc)", () => {
    const boost = 10 * KPA_PER_PSI;
    const r = fuelPumpFlowNeeded({
      powerKw: 190,
      bsfcGPerKwh: 300,
      fuelDensityKgPerL: 0.74,
      basePressureKpa: 300,
      boostKpa: boost,
      marginFraction: 0.25,
    });
    expectWithin(r.fuelKgH, 57, 1e-12);
    expectWithin(r.flowLh, (57 / 0.74) * 1.25, 1e-12);
    expectWithin(r.flowLh, 96.28, 0.005);
    expectWithin(r.pressureKpa, 300 + boost, 1e-12);
  });
  it("without a margin it is what the engine burns", () => {
    const r = fuelPumpFlowNeeded({ powerKw: 100, bsfcGPerKwh: 380, fuelDensityKgPerL: 0.745, basePressureKpa: 300, boostKpa: 0 });
    expectWithin(r.flowLh, 38 / 0.745, 1e-12);
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(
      () =>
        fuelPumpFlowNeeded({
          powerKw: 100,
          bsfcGPerKwh: 380,
          fuelDensityKgPerL: 0.745,
          basePressureKpa: 300,
          boostKpa: 0,
          marginFraction: 25,
        }),
      "Fuel pump margin",
      /0\.25 means 25 % extra\); got 25\./,
    );
  });
});
