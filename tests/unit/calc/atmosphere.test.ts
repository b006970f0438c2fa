import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { stationPressureKpa } from "@/lib/calc";
import { expectWithin, expectWorkshopError } from "./helpers";

// U.S. Standard Atmosphere 1976 constants, written out here independently of lib/calc:
// R* = 8.31432 N·m/(mol·K), M0 = 0.0289644 kg/mol, g0 = 9.80665 m/s², L = -6.5 K/km, T0 = 288.15 K.
const R_STAR = 8.31432;
const M0 = 0.0289644;
const G0 = 9.80665;
const LAPSE = 0.0065;
const T0 = 288.15;
/** US 1976 eq. 33a (troposphere): P = Pb · [Tb / (Tb + Lb·(H − Hb))]^(g0·M0 / (R*·Lb)). */
const us1976 = (p0: number, h: number) => p0 * Math.pow(T0 / (T0 - LAPSE * h), -(G0 * M0) / (R_STAR * LAPSE));

describe("stationPressureKpa — standard-atmosphere barometric relation (ISO 2533 / U.S. Standard Atmosphere 1976)", () => {
  it("101.325 kPa at 1 000 m → 89.875 kPa (REFERENCE-CHECKS, calc from p0·(1 − 2.25577e-5·h)^5.25588)", () => {
    expectWithin(stationPressureKpa(101.325, 1000), 89.875, 0.0005);
  });
  it("sea level gives the sea-level pressure back", () => {
    expect(stationPressureKpa(101.325, 0)).toBe(101.325);
    expect(stationPressureKpa(98.2, 0)).toBe(98.2);
  });
  it("11 000 m → 22.632 kPa, the tropopause pressure of the U.S. Standard Atmosphere 1976 table (from memory)", () => {
    expectWithin(stationPressureKpa(101.325, 11000), 22.632, 0.002);
  });
  it("matches the U.S. 1976 formula written with its own constants (R*, M0) to 1 part in 10⁵", () => {
    for (const h of [-500, 0, 500, 1000, 1609, 2500, 4000, 8000, 11000]) {
      const ours = stationPressureKpa(101.325, h);
      expect(Math.abs(ours - us1976(101.325, h)) / ours, `${h} m`).toBeLessThan(1e-5);
    }
  });
  it("falls about 11 % by 1 000 m: the sea-level weather figure is not the pressure at the dyno", () => {
    const drop = 1 - stationPressureKpa(101.325, 1000) / 101.325;
    expect(drop).toBeGreaterThan(0.1);
    expect(drop).toBeLessThan(0.12);
  });
  it("decreases with altitude and scales with the sea-level pressure (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 85, max: 110, noNaN: true }),
        fc.double({ min: -500, max: 10999, noNaN: true }),
        fc.double({ min: 0.5, max: 500, noNaN: true }),
        (p0, h, dh) => {
          const higher = Math.min(h + dh, 11000);
          const a = stationPressureKpa(p0, h);
          return stationPressureKpa(p0, higher) < a && Math.abs(a / p0 - stationPressureKpa(101.325, h) / 101.325) < 1e-12;
        },
      ),
    );
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(
      () => stationPressureKpa(1013, 100),
      "Sea-level pressure (weather report)",
      /^Sea-level pressure \(weather report\) must be between 85 and 110 kPa; got 1013 kPa\.$/,
      "seaLevelPressureKpa",
    );
    expectWorkshopError(() => stationPressureKpa(101.3, 12000), "Altitude", /between -500 and 11 000 m; got 12 000 m\./, "altitudeM");
    expectWorkshopError(() => stationPressureKpa(101.3, Number.NaN), "Altitude", /not a number/);
    expectWorkshopError(() => stationPressureKpa(-101.3, 0), "Sea-level pressure (weather report)", /got -101\.3 kPa/);
  });
});
