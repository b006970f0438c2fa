import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { unit } from "mathjs";
import {
  convertLength,
  convertPower,
  convertPressure,
  convertTemperature,
  convertTorque,
  LENGTH_UNITS,
  POWER_UNITS,
  PRESSURE_UNITS,
  TEMPERATURE_UNITS,
  TORQUE_UNITS,
  type LengthUnit,
  type PowerUnit,
  type PressureUnit,
  type TemperatureUnit,
  type TorqueUnit,
} from "@/lib/calc";
import { expectCalcError, expectRelClose, expectWithin, isRelClose } from "./helpers";

describe("conversion constants (published values)", () => {
  it("torque: NIST SP 811 App. B.8", () => {
    // NIST SP 811 B.8: 1 lbf·ft = 1.355 818 N·m; exact from 1 lb = 0.453 592 37 kg, gₙ = 9.806 65 m/s², 1 ft = 0.3048 m
    expectRelClose(convertTorque(1, "lbf·ft", "N·m"), 1.3558179483314, 1e-13);
    // NIST SP 811 B.8: 1 lbf·in = 0.112 984 8 N·m (= 4.4482216152605 N × 0.0254 m)
    expectRelClose(convertTorque(1, "lbf·in", "N·m"), 4.4482216152605 * 0.0254, 1e-14);
    // NIST SP 811 B.8: 1 kgf·m = 9.806 65 N·m (exact)
    expectRelClose(convertTorque(1, "kgf·m", "N·m"), 9.80665, 1e-15);
    // 1 lbf·ft = 12 lbf·in (1 ft = 12 in, exact)
    expectRelClose(convertTorque(1, "lbf·ft", "lbf·in"), 12, 1e-14);
  });

  it("pressure: NIST SP 811 App. B.8 and ISO 2533 standard atmosphere", () => {
    // NIST SP 811 B.8: 1 psi = 6.894 757 kPa (exact from lbf and inch: 6894.757293168 Pa)
    expectRelClose(convertPressure(1, "psi", "kPa"), 6.894757293168, 1e-12);
    // NIST SP 811 B.8: inch of mercury, conventional = 3.386 389 E+03 Pa (7 significant digits)
    expectWithin(convertPressure(1, "inHg", "kPa"), 3.386389, 0.0000005);
    // NIST SP 811 B.8: 1 bar = 1 × 10⁵ Pa; 1 mbar = 100 Pa
    expect(convertPressure(1, "bar", "kPa")).toBe(100);
    expectRelClose(convertPressure(1013.25, "mbar", "kPa"), 101.325, 1e-15);
    // ISO 2533 / U.S. Standard Atmosphere 1976: 101 325 Pa = 14.696 psi = 29.921 inHg
    expectWithin(convertPressure(101.325, "kPa", "psi"), 14.696, 0.0005);
    expectWithin(convertPressure(101.325, "kPa", "inHg"), 29.921, 0.0005);
  });

  it("power: NIST SP 811 App. B.8", () => {
    // NIST SP 811 B.8: horsepower (550 ft·lbf/s) = 7.456 999 E+02 W; exact 745.69987158227 W
    expectRelClose(convertPower(1, "hp", "kW"), 0.74569987158227, 1e-13);
    // NIST SP 811 B.8: horsepower, metric = 7.354 988 E+02 W (75 kgf·m/s = 735.498 75 W exactly)
    expectRelClose(convertPower(1, "PS", "kW"), 0.73549875, 1e-15);
  });

  it("length: NIST SP 811 App. B.8 (1 in = 25.4 mm exactly)", () => {
    expect(convertLength(1, "in", "mm")).toBe(25.4);
    expect(convertLength(1000, "µm", "mm")).toBe(1);
    // 0.001 in = 25.4 µm (exact)
    expectRelClose(convertLength(0.001, "in", "µm"), 25.4, 1e-15);
  });

  it("temperature: SI definition T/K = t/°C + 273.15; t/°F = 1.8·t/°C + 32 (NIST SP 811 B.8)", () => {
    expect(convertTemperature(0, "C", "K")).toBe(273.15);
    expect(convertTemperature(32, "F", "C")).toBe(0);
    expect(convertTemperature(212, "F", "C")).toBe(100);
    expect(convertTemperature(-40, "C", "F")).toBe(-40);
    // ISO 2533 sea level: 288.15 K = 15 °C = 59 °F
    expectWithin(convertTemperature(288.15, "K", "C"), 15, 1e-12);
    expectWithin(convertTemperature(288.15, "K", "F"), 59, 1e-12);
    // absolute zero = −459.67 °F (NIST SP 811 B.8)
    expectWithin(convertTemperature(0, "K", "F"), -459.67, 1e-12);
  });
});

// --- cross-check against mathjs units -------------------------------------------------------
// Each of our units as a mathjs quantity: value × multiplier in the mathjs unit string.
// inHg is built from its definition (conventional mercury density 13 595.1 kg/m³ × gₙ × 1 in,
// NIST SP 811) because mathjs has no inHg; PS from 75 kgf·m/s. mathjs's own psi and hp constants
// are rounded (≈ 6e-11 and 6e-12 relative), hence the 1e-9 tolerance.
const MATHJS_TORQUE: Record<TorqueUnit, [string, number]> = {
  "N·m": ["N m", 1],
  "lbf·ft": ["lbf ft", 1],
  "lbf·in": ["lbf in", 1],
  "kgf·m": ["kgf m", 1],
};
const MATHJS_PRESSURE: Record<PressureUnit, [string, number]> = {
  kPa: ["kPa", 1],
  psi: ["psi", 1],
  bar: ["bar", 1],
  mbar: ["mbar", 1],
  inHg: ["kg m^-2 s^-2 in", 13595.1 * 9.80665],
};
const MATHJS_POWER: Record<PowerUnit, [string, number]> = {
  kW: ["kW", 1],
  hp: ["hp", 1],
  PS: ["kgf m/s", 75],
};
const MATHJS_LENGTH: Record<LengthUnit, [string, number]> = {
  mm: ["mm", 1],
  in: ["in", 1],
  µm: ["um", 1],
};
const MATHJS_TEMPERATURE: Record<TemperatureUnit, string> = { C: "degC", K: "K", F: "degF" };

function viaMathjs<U extends string>(table: Record<U, [string, number]>, value: number, from: U, to: U): number {
  const [fromName, fromScale] = table[from];
  const [toName, toScale] = table[to];
  return unit(value * fromScale, fromName).toNumber(toName) / toScale;
}

// Any workshop magnitude, sign included; subnormal doubles (< 1e-300) are left out because they
// carry too few significant bits for a relative comparison to mean anything.
const magnitude = fc.double({ min: -1e9, max: 1e9, noNaN: true, noDefaultInfinity: true }).filter((v) => v === 0 || Math.abs(v) > 1e-300);

function crossCheck<U extends string>(
  name: string,
  units: readonly U[],
  convert: (v: number, a: U, b: U) => number,
  table: Record<U, [string, number]>,
) {
  it(`${name}: every unit pair agrees with mathjs (fast-check)`, () => {
    fc.assert(
      fc.property(magnitude, fc.constantFrom(...units), fc.constantFrom(...units), (v, a, b) => {
        const ours = convert(v, a, b);
        const theirs = viaMathjs(table, v, a, b);
        return isRelClose(ours, theirs, 1e-9);
      }),
      { numRuns: 2000 },
    );
  });
  it(`${name}: round trip a → b → a returns the value (fast-check)`, () => {
    fc.assert(
      fc.property(magnitude, fc.constantFrom(...units), fc.constantFrom(...units), (v, a, b) =>
        isRelClose(convert(convert(v, a, b), b, a), v, 1e-14),
      ),
      { numRuns: 2000 },
    );
  });
}

describe("conversions cross-checked against mathjs", () => {
  crossCheck("torque", TORQUE_UNITS, convertTorque, MATHJS_TORQUE);
  crossCheck("pressure", PRESSURE_UNITS, convertPressure, MATHJS_PRESSURE);
  crossCheck("power", POWER_UNITS, convertPower, MATHJS_POWER);
  crossCheck("length", LENGTH_UNITS, convertLength, MATHJS_LENGTH);

  it("temperature: every unit pair agrees with mathjs (fast-check)", () => {
    const kelvin = fc.double({ min: 0, max: 10000, noNaN: true });
    fc.assert(
      fc.property(kelvin, fc.constantFrom(...TEMPERATURE_UNITS), fc.constantFrom(...TEMPERATURE_UNITS), (k, a, b) => {
        const v = unit(k, "K").toNumber(MATHJS_TEMPERATURE[a]);
        if (a !== "K" && convertTemperature(v, a, "K") < 0) return true; // rounding at absolute zero
        const ours = convertTemperature(v, a, b);
        const theirs = unit(v, MATHJS_TEMPERATURE[a]).toNumber(MATHJS_TEMPERATURE[b]);
        return Math.abs(ours - theirs) <= 1e-9 * Math.max(1, Math.abs(theirs));
      }),
      { numRuns: 2000 },
    );
  });

  it("temperature: round trip returns the value (fast-check)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 10000, noNaN: true }),
        fc.constantFrom(...TEMPERATURE_UNITS),
        fc.constantFrom(...TEMPERATURE_UNITS),
        (k, a, b) => {
          const v = convertTemperature(k, "K", a);
          if (convertTemperature(v, a, "K") < 0) return true;
          return Math.abs(convertTemperature(convertTemperature(v, a, b), b, a) - v) <= 1e-9;
        },
      ),
      { numRuns: 2000 },
    );
  });
});

describe("conversion errors", () => {
  it("rejects unknown units, naming the argument", () => {
    expectCalcError(() => convertTorque(1, "ft·lb" as TorqueUnit, "N·m"), "from", /"ft·lb"/);
    expectCalcError(() => convertPressure(1, "kPa", "atm" as PressureUnit), "to", /"atm"/);
    expectCalcError(() => convertPower(1, "W" as PowerUnit, "kW"), "from");
    expectCalcError(() => convertLength(1, "mm", "cm" as LengthUnit), "to");
    expectCalcError(() => convertTemperature(1, "R" as TemperatureUnit, "K"), "from");
  });
  it("rejects non-finite values", () => {
    expectCalcError(() => convertTorque(Number.NaN, "N·m", "lbf·ft"), "value", /NaN/);
    expectCalcError(() => convertPressure(Infinity, "kPa", "psi"), "value", /Infinity/);
    expectCalcError(() => convertPower(Number.NaN, "kW", "hp"), "value");
    expectCalcError(() => convertLength(-Infinity, "mm", "in"), "value");
    expectCalcError(() => convertTemperature(Number.NaN, "C", "F"), "value");
  });
  it("rejects temperatures below absolute zero", () => {
    expectCalcError(() => convertTemperature(-274, "C", "K"), "value", /absolute zero/);
    expectCalcError(() => convertTemperature(-1, "K", "C"), "value", /absolute zero/);
    expectCalcError(() => convertTemperature(-460, "F", "C"), "value", /absolute zero/);
  });
});
