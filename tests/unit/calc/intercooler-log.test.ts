import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { intercoolerFromLog } from "@/lib/calc";
import { expectWithin, expectWorkshopError } from "./helpers";

const K = (c: number) => c + 273.15; // NIST SP 811: T/K = t/°C + 273.15

describe("intercoolerFromLog — ε = (Tin − Tout)/(Tin − Tamb), Δp = pin − pout", () => {
  it("25, 22, 20 °C → 0.60 (published page, REFERENCE-CHECKS)", () => {
    expectWithin(intercoolerFromLog({ inletTempK: K(25), outletTempK: K(22), ambientTempK: K(20) }).effectiveness, 0.6, 1e-12);
  });
  it("a logged pull: 112.07 °C in, 46.77 °C out at 25 °C ambient → ε 0.75 (REFERENCE-CHECKS, calc)", () => {
    const r = intercoolerFromLog({
      inletTempK: K(112.07),
      outletTempK: K(46.77),
      ambientTempK: K(25),
      inletPressureKpa: 176,
      outletPressureKpa: 169,
    });
    expectWithin(r.effectiveness, 0.75, 0.0001);
    expectWithin(r.temperatureDropK, 65.3, 1e-9);
    expectWithin(r.pressureDropKpa!, 7, 1e-12);
    expectWithin(r.pressureDropFraction!, 7 / 176, 1e-15);
  });
  it("without pressures it rates temperatures only", () => {
    const r = intercoolerFromLog({ inletTempK: K(90), outletTempK: K(40), ambientTempK: K(20) });
    expect(r.pressureDropKpa).toBeNull();
    expect(r.pressureDropFraction).toBeNull();
  });
  it("returns a sensor problem as it is (ε above 1) instead of hiding it", () => {
    expect(intercoolerFromLog({ inletTempK: K(90), outletTempK: K(15), ambientTempK: K(20) }).effectiveness).toBeGreaterThan(1);
  });
  it("an outlet between ambient and inlet gives ε between 0 and 1 (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -10, max: 45, noNaN: true }),
        fc.double({ min: 1, max: 150, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (amb, rise, share) => {
          const tin = K(amb + rise);
          const tout = K(amb + rise * (1 - share));
          const e = intercoolerFromLog({ inletTempK: tin, outletTempK: tout, ambientTempK: K(amb) }).effectiveness;
          return e >= -1e-9 && e <= 1 + 1e-9 && Math.abs(e - share) < 1e-9;
        },
      ),
    );
  });
  it("refuses what cannot be rated, in workshop words", () => {
    expectWorkshopError(
      () => intercoolerFromLog({ inletTempK: K(18), outletTempK: K(17), ambientTempK: K(20) }),
      "Intercooler inlet temperature",
      /must be above the ambient air temperature \(293\.15 K, 20 °C\) to rate the intercooler; got 291\.15 K \(18 °C\)\./,
      "inletTempK",
    );
    expectWorkshopError(
      () => intercoolerFromLog({ inletTempK: K(90), outletTempK: K(40), ambientTempK: K(20), inletPressureKpa: 170 }),
      "Pressure after the intercooler (absolute)",
      /give both or neither/,
      "outletPressureKpa",
    );
    expectWorkshopError(
      () => intercoolerFromLog({ inletTempK: 90, outletTempK: K(40), ambientTempK: K(20) }),
      "Intercooler inlet temperature",
      /got 90 K \(-183\.15 °C\)/,
    );
    expectWorkshopError(
      () =>
        intercoolerFromLog({ inletTempK: K(90), outletTempK: K(40), ambientTempK: K(20), inletPressureKpa: 70, outletPressureKpa: 1e9 }),
      "Pressure after the intercooler (absolute)",
      /got 1 000 000 000 kPa/,
    );
  });
});
