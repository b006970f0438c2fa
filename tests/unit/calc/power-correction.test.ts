import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  ALL_POWER_CORRECTION_STANDARD_IDS,
  BOOSTED_ENGINE_CAUTION,
  POWER_CORRECTION_STANDARDS,
  POWER_CORRECTION_STANDARD_IDS,
  POWER_CORRECTION_VALIDITY,
  STATION_PRESSURE_NOTE,
  correctionValidity,
  powerCorrectionFactor,
  stationPressureKpa,
  saturationVaporPressureKpa,
  vaporPressureKpa,
  type AtmosphericConditions,
  type PowerCorrectionStandard,
} from "@/lib/calc";
import { expectCalcError, expectWithin } from "./helpers";

const KPA_PER_INHG = 3.386389; // NIST SP 811 B.8: inch of mercury, conventional = 3.386 389 E+03 Pa
const fToC = (f: number) => (f - 32) / 1.8; // NIST SP 811 B.8
const mbar = (p: number) => p / 10; // 1 mbar = 0.1 kPa

describe("SAE J1349, 1990 form: CF = 1.18·(990/Pd)·√((T+273)/298) − 0.18", () => {
  // formula read on a public page; checks are arithmetic from it (REFERENCE-CHECKS)
  it("990 mbar dry, 25 °C → 1.00000", () => {
    expectWithin(powerCorrectionFactor("SAE_J1349", { pressureKpa: mbar(990), temperatureC: 25 }), 1, 0.000005);
  });
  it("1000 mbar, 30 °C → 0.99796", () => {
    expectWithin(powerCorrectionFactor("SAE_J1349", { pressureKpa: mbar(1000), temperatureC: 30 }), 0.99796, 0.000005);
  });
  it("950 mbar, 35 °C → 1.07015", () => {
    expectWithin(powerCorrectionFactor("SAE_J1349", { pressureKpa: mbar(950), temperatureC: 35 }), 1.07015, 0.000005);
  });
  it("uses dry-air pressure: vapour pressure is subtracted from barometric", () => {
    const wet = powerCorrectionFactor("SAE_J1349", { pressureKpa: 101, temperatureC: 30, vaporPressureKpa: 2 });
    const dry = powerCorrectionFactor("SAE_J1349", { pressureKpa: 99, temperatureC: 30 });
    expect(wet).toBe(dry);
  });
  it("is labelled with its form", () => {
    expect(POWER_CORRECTION_STANDARDS.SAE_J1349.label).toBe("SAE J1349 (1990 form)");
  });
});

describe("SAE J1349, current form (from memory): CF = 1.176·(99/pd)·√((t+273.15)/298) − 0.176", () => {
  // The form implemented is the 2004 revision's as remembered (REFERENCE-CHECKS marks it [memory]);
  // the checks are arithmetic from that remembered formula, not from the SAE text.
  it("95 kPa dry, 30 °C → 1.06006 (REFERENCE-CHECKS, calc; formula from memory)", () => {
    expectWithin(powerCorrectionFactor("SAE_J1349_CURRENT", { pressureKpa: 95, temperatureC: 30 }), 1.06006, 0.000005);
  });
  it("is exactly 1 at 99 kPa dry and 298 K (24.85 °C); 1.0003 at 25 °C with T = t + 273.15 (pinned)", () => {
    expectWithin(powerCorrectionFactor("SAE_J1349_CURRENT", { pressureKpa: 99, temperatureC: 24.85 }), 1, 1e-12);
    expectWithin(powerCorrectionFactor("SAE_J1349_CURRENT", { pressureKpa: 99, temperatureC: 25 }), 1.0003, 0.00005);
  });
  it("uses dry-air pressure like the 1990 form", () => {
    const wet = powerCorrectionFactor("SAE_J1349_CURRENT", { pressureKpa: 101, temperatureC: 30, vaporPressureKpa: 2 });
    expect(wet).toBe(powerCorrectionFactor("SAE_J1349_CURRENT", { pressureKpa: 99, temperatureC: 30 }));
  });
  it("stays within 0.0007 of the 1990 form over 90–105 kPa and 15–35 °C (REFERENCE-CHECKS claim, property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 90, max: 105, noNaN: true }), fc.double({ min: 15, max: 35, noNaN: true }), (p, t) => {
        const c = { pressureKpa: p, temperatureC: t };
        return Math.abs(powerCorrectionFactor("SAE_J1349_CURRENT", c) - powerCorrectionFactor("SAE_J1349", c)) < 0.0007;
      }),
    );
  });
  it("is named beside the 1990 form and says its formula is from memory", () => {
    expect(POWER_CORRECTION_STANDARDS.SAE_J1349_CURRENT.label).toBe("SAE J1349 (current form, 2004 revision on)");
    expect(POWER_CORRECTION_STANDARDS.SAE_J1349_CURRENT.formulaBasis).toMatch(/^From memory/);
    expect(ALL_POWER_CORRECTION_STANDARD_IDS).toContain("SAE_J1349_CURRENT");
    // dyno runs may be recorded under it too (the dyno record's check takes it since migration 070)
    expect(POWER_CORRECTION_STANDARD_IDS).toContain("SAE_J1349_CURRENT");
  });
  it("a station pressure from altitude feeds it: 1 000 m on a 101.325 kPa day, 25 °C → about 1.10 (calc)", () => {
    const p = stationPressureKpa(101.325, 1000);
    expectWithin(
      powerCorrectionFactor("SAE_J1349_CURRENT", { pressureKpa: p, temperatureC: 25 }),
      1.176 * (99 / p) * Math.sqrt(298.15 / 298) - 0.176,
      1e-12,
    );
    // entering the sea-level figure instead would understate the correction by about 12 %
    expect(powerCorrectionFactor("SAE_J1349_CURRENT", { pressureKpa: p, temperatureC: 25 })).toBeGreaterThan(
      powerCorrectionFactor("SAE_J1349_CURRENT", { pressureKpa: 101.325, temperatureC: 25 }) + 0.1,
    );
  });
});

describe("correctionValidity — each standard's range as data, findings in workshop words", () => {
  it("SAE J1349 (both forms, from memory): 15–35 °C and 90–105 kPa dry air", () => {
    for (const s of ["SAE_J1349", "SAE_J1349_CURRENT"] as const) {
      expect(POWER_CORRECTION_VALIDITY[s].temperatureC).toEqual({ min: 15, max: 35 });
      expect(POWER_CORRECTION_VALIDITY[s].pressureKpa).toEqual({ min: 90, max: 105 });
      expect(POWER_CORRECTION_VALIDITY[s].basis).toMatch(/^From memory/);
    }
  });
  it("inside the range, limits included, says so", () => {
    const r = correctionValidity("SAE_J1349", { pressureKpa: 90, temperatureC: 35 });
    expect(r).toMatchObject({ standard: "SAE_J1349", rangeKnown: true, inside: true, outside: [] });
    expect(r.factor).toBe(powerCorrectionFactor("SAE_J1349", { pressureKpa: 90, temperatureC: 35 }));
  });
  it("names each condition outside the range, with the standard's name and its limits", () => {
    const r = correctionValidity("SAE_J1349", { pressureKpa: 88, temperatureC: 38 });
    expect(r.inside).toBe(false);
    expect(r.outside).toEqual([
      { quantity: "temperature", message: "Intake air 38 °C is above the 35 °C upper limit of SAE J1349 (1990 form) (15–35 °C)." },
      { quantity: "pressure", message: "Dry-air pressure 88 kPa is below the 90 kPa lower limit of SAE J1349 (1990 form) (90–105 kPa)." },
    ]);
  });
  it("checks the dry-air pressure, not the barometer reading, where the standard uses it", () => {
    // 92 kPa barometric with 3 kPa of water vapour is 89 kPa dry: outside
    const r = correctionValidity("SAE_J1349_CURRENT", { pressureKpa: 92, temperatureC: 30, vaporPressureKpa: 3 });
    expect(r.outside.map((f) => f.quantity)).toEqual(["pressure"]);
    expect(r.outside[0].message).toMatch(/^Dry-air pressure 89 kPa is below/);
  });
  it("ISO 1585 (from memory): 15–35 °C and a factor between 0.93 and 1.07", () => {
    const r = correctionValidity("ISO_1585", { pressureKpa: 85, temperatureC: 38 });
    expect(r.outside.map((f) => f.quantity)).toEqual(["temperature", "factor"]);
    expect(r.outside[1].message).toMatch(/^Correction factor 1\.\d{3} is above the 1\.07 upper limit of ISO 1585/);
    expect(correctionValidity("ISO_1585", { pressureKpa: 99, temperatureC: 25 }).inside).toBe(true);
  });
  it("where no range is on record it says so instead of guessing", () => {
    for (const s of ["DIN_70020", "SAE_J607"] as const) {
      const r = correctionValidity(s, { pressureKpa: 70, temperatureC: 45 });
      expect(r.rangeKnown).toBe(false);
      expect(r.inside).toBe(true);
      expect(r.basis).toMatch(/No validity range is on record/);
    }
  });
  it("carries the boosted-engine caution and the station-pressure note in words", () => {
    expect(BOOSTED_ENGINE_CAUTION).toMatch(/over-corrected/);
    expect(STATION_PRESSURE_NOTE).toMatch(/station pressure/);
    expect(STATION_PRESSURE_NOTE).toMatch(/not the weather report's sea-level pressure/);
  });
});

describe("DIN 70020: CF = (1013/p)·√((T+273)/293), total pressure", () => {
  // formula read on a public page; checks are arithmetic from it (REFERENCE-CHECKS)
  it("1013 mbar, 20 °C → 1.0", () => {
    expectWithin(powerCorrectionFactor("DIN_70020", { pressureKpa: mbar(1013), temperatureC: 20 }), 1, 1e-12);
  });
  it("1000 mbar, 30 °C → 1.03014", () => {
    expectWithin(powerCorrectionFactor("DIN_70020", { pressureKpa: mbar(1000), temperatureC: 30 }), 1.03014, 0.000005);
  });
  it("950 mbar, 35 °C → 1.09327", () => {
    expectWithin(powerCorrectionFactor("DIN_70020", { pressureKpa: mbar(950), temperatureC: 35 }), 1.09327, 0.000005);
  });
  it("ignores humidity", () => {
    const a = powerCorrectionFactor("DIN_70020", { pressureKpa: 98, temperatureC: 28 });
    const b = powerCorrectionFactor("DIN_70020", { pressureKpa: 98, temperatureC: 28, vaporPressureKpa: 3 });
    expect(a).toBe(b);
  });
});

describe("ISO 1585 / EEC 80/1269, spark ignition: α = (99/pd)^1.2·(T/298)^0.6, T = t + 273 (pinned)", () => {
  // formula read on a public page; checks are arithmetic from it with T = t + 273 (REFERENCE-CHECKS)
  it("99 kPa dry, 25 °C → exactly 1.0 (with t + 273.15 it would be 1.0003)", () => {
    expectWithin(powerCorrectionFactor("ISO_1585", { pressureKpa: 99, temperatureC: 25 }), 1, 1e-12);
  });
  it("100 kPa, 30 °C → 0.99793", () => {
    expectWithin(powerCorrectionFactor("ISO_1585", { pressureKpa: 100, temperatureC: 30 }), 0.99793, 0.000005);
  });
  it("95 kPa, 35 °C → 1.07175", () => {
    expectWithin(powerCorrectionFactor("ISO_1585", { pressureKpa: 95, temperatureC: 35 }), 1.07175, 0.000005);
  });
});

describe("SAE J607: CF = (29.92/Pd)·√((°F+460)/520), Pd dry inHg", () => {
  it("29.00 inHg dry, 85 °F → 1.05623 (REFERENCE-CHECKS, calc from the published formula)", () => {
    const f = powerCorrectionFactor("SAE_J607", { pressureKpa: 29 * KPA_PER_INHG, temperatureC: fToC(85) });
    expectWithin(f, 1.05623, 0.00001);
  });
  it("28.85 inHg, 85 °F, 85 % RH → 1.1005 (published example, ±0.001; 1.1011 with the Buck equation)", () => {
    const t = fToC(85);
    const f = powerCorrectionFactor("SAE_J607", {
      pressureKpa: 28.85 * KPA_PER_INHG,
      temperatureC: t,
      vaporPressureKpa: vaporPressureKpa(t, 85),
    });
    expectWithin(f, 1.1005, 0.001);
    expectWithin(f, 1.1011, 0.0001);
  });
});

describe("Buck equation for water-vapour pressure", () => {
  it("gives 0.61121 kPa at 0 °C (the equation's own coefficient, Buck 1981/1996)", () => {
    expect(saturationVaporPressureKpa(0)).toBe(0.61121);
  });
  it("matches steam-table saturation pressures at 20 and 25 °C (IAPWS tables, from memory: 2.339, 3.170 kPa)", () => {
    expectWithin(saturationVaporPressureKpa(20), 2.339, 0.002);
    expectWithin(saturationVaporPressureKpa(25), 3.17, 0.002);
  });
  it("is near one standard atmosphere at 100 °C (boiling point at 101.325 kPa, ±0.5 %)", () => {
    expectWithin(saturationVaporPressureKpa(100), 101.325, 0.5);
  });
  it("vapour pressure = RH/100 × saturation pressure, rising with temperature (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: -20, max: 50, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }), (t, rh) => {
        const pv = vaporPressureKpa(t, rh);
        return (
          Math.abs(pv - (rh / 100) * saturationVaporPressureKpa(t)) < 1e-15 &&
          saturationVaporPressureKpa(t + 1) > saturationVaporPressureKpa(t)
        );
      }),
    );
  });
  it("throws CalcInputError for impossible input", () => {
    expectCalcError(() => vaporPressureKpa(25, 101), "relativeHumidityPercent", /\[0, 100\]/);
    expectCalcError(() => vaporPressureKpa(25, -1), "relativeHumidityPercent");
    expectCalcError(() => vaporPressureKpa(Number.NaN, 50), "temperatureC");
    expectCalcError(() => saturationVaporPressureKpa(150), "temperatureC");
  });
});

describe("powerCorrectionFactor — common behaviour", () => {
  const standards = Object.keys(POWER_CORRECTION_STANDARDS) as PowerCorrectionStandard[];
  it("every standard: hotter or thinner air → larger factor (property)", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...standards),
        fc.double({ min: 70, max: 105, noNaN: true }),
        fc.double({ min: -10, max: 45, noNaN: true }),
        (s, p, t) => {
          const f = powerCorrectionFactor(s, { pressureKpa: p, temperatureC: t });
          return (
            powerCorrectionFactor(s, { pressureKpa: p - 1, temperatureC: t }) > f &&
            powerCorrectionFactor(s, { pressureKpa: p, temperatureC: t + 1 }) > f
          );
        },
      ),
    );
  });
  it("throws CalcInputError for impossible input", () => {
    const ok: AtmosphericConditions = { pressureKpa: 100, temperatureC: 20 };
    expectCalcError(() => powerCorrectionFactor("SAE_J1349_2004" as PowerCorrectionStandard, ok), "standard", /"SAE_J1349_2004"/);
    expectCalcError(() => powerCorrectionFactor("DIN_70020", { ...ok, pressureKpa: 0 }), "conditions.pressureKpa");
    expectCalcError(() => powerCorrectionFactor("ISO_1585", { ...ok, temperatureC: -300 }), "conditions.temperatureC", /absolute zero/);
    expectCalcError(() => powerCorrectionFactor("SAE_J607", { ...ok, temperatureC: Number.NaN }), "conditions.temperatureC");
    expectCalcError(() => powerCorrectionFactor("SAE_J1349", { ...ok, vaporPressureKpa: -1 }), "conditions.vaporPressureKpa");
    expectCalcError(() => powerCorrectionFactor("SAE_J1349", { ...ok, vaporPressureKpa: 100 }), "conditions.vaporPressureKpa", /below/);
    expectCalcError(() => powerCorrectionFactor("SAE_J1349", undefined as unknown as AtmosphericConditions), "conditions");
  });
});
