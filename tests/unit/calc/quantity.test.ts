import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { CalcInputError, INPUT_RULES, describeRange, formatNumber, isInRange, requireQuantity, type QuantityRule } from "@/lib/calc";
import { expectWorkshopError } from "./helpers";

describe("formatNumber — numbers as a person writes them", () => {
  it("groups thousands with a space from 10 000 up, not below", () => {
    expect(formatNumber(25000)).toBe("25 000");
    expect(formatNumber(1234567.5)).toBe("1 234 567.5");
    expect(formatNumber(9999)).toBe("9999");
    expect(formatNumber(-12000)).toBe("-12 000");
    expect(formatNumber(0)).toBe("0");
  });
  it("keeps at most 10 significant digits and plain decimals", () => {
    expect(formatNumber(0.1 + 0.2)).toBe("0.3");
    expect(formatNumber(2 / 3)).toBe("0.6666666667");
    expect(formatNumber(1e300)).toBe("1e+300");
  });
  it("reads back as the same number to 10 significant digits (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e12, max: 1e12, noNaN: true }).filter((x) => Math.abs(x) >= 1e-6 || x === 0),
        (x) => {
          const back = Number(formatNumber(x).replace(/ /g, ""));
          return Math.abs(back - x) <= 1e-9 * Math.max(1, Math.abs(x));
        },
      ),
    );
  });
});

describe("requireQuantity — range checks in workshop words", () => {
  it("passes a value inside the range through unchanged, boundaries included", () => {
    expect(requireQuantity(INPUT_RULES.engineSpeed, 1, "rpm")).toBe(1);
    expect(requireQuantity(INPUT_RULES.engineSpeed, 25000, "rpm")).toBe(25000);
    expect(requireQuantity(INPUT_RULES.engineSpeed, 6500.5, "rpm")).toBe(6500.5);
  });
  it("words the brief's own example exactly", () => {
    const err = expectWorkshopError(() => requireQuantity(INPUT_RULES.engineSpeed, -5, "rpm"), "Engine speed", undefined, "rpm");
    expect(err.message).toBe("Engine speed must be between 1 and 25 000 rpm; got -5 rpm.");
    expect(err.value).toBe(-5);
  });
  it("names what was entered when it is not a number, without NaN or Infinity", () => {
    expectWorkshopError(
      () => requireQuantity(INPUT_RULES.engineSpeed, Number.NaN),
      "Engine speed",
      /got something that is not a number\.$/,
    );
    expectWorkshopError(() => requireQuantity(INPUT_RULES.engineSpeed, Infinity), "Engine speed", /got a number too large to use\.$/);
    expectWorkshopError(() => requireQuantity(INPUT_RULES.engineSpeed, -Infinity), "Engine speed", /too large/);
    expectWorkshopError(() => requireQuantity(INPUT_RULES.engineSpeed, undefined), "Engine speed", /got nothing\.$/);
    expectWorkshopError(() => requireQuantity(INPUT_RULES.engineSpeed, null), "Engine speed", /got nothing\.$/);
    expectWorkshopError(() => requireQuantity(INPUT_RULES.engineSpeed, "6000"), "Engine speed", /got "6000" \(text, not a number\)\.$/);
    expectWorkshopError(() => requireQuantity(INPUT_RULES.engineSpeed, {}), "Engine speed", /not a number/);
  });
  it("says 'more than' for an open end and 'whole number' for counts", () => {
    expectWorkshopError(
      () => requireQuantity(INPUT_RULES.volumetricEfficiency, 0),
      "Volumetric efficiency",
      /^Volumetric efficiency must be more than 0 and at most 1\.5 \(as a fraction: 0\.9 means 90 %\); got 0\.$/,
    );
    expectWorkshopError(
      () => requireQuantity(INPUT_RULES.injectors, 2.5),
      "Number of injectors",
      /^Number of injectors must be a whole number from 1 to 32; got 2\.5\.$/,
    );
  });
  it("shows kelvin figures in °C too (workshops think in °C)", () => {
    expectWorkshopError(
      () => requireQuantity(INPUT_RULES.manifoldTemperature, 20),
      "Manifold air temperature",
      /^Manifold air temperature must be between 220 and 500 K \(-53\.15 to 226\.85 °C\); got 20 K \(-253\.15 °C\)\.$/,
    );
  });
  it("every rule in INPUT_RULES has a label without internal names and a sane range", () => {
    for (const [key, rule] of Object.entries(INPUT_RULES) as Array<[string, QuantityRule]>) {
      expect(rule.label.replace(/\bkPa\b/g, ""), key).not.toMatch(/\b[a-z]+[A-Z]/);
      expect(rule.min, key).toBeLessThan(rule.max);
      expect(describeRange(rule), key).toMatch(/^(between|more than|at least|a whole number)/);
    }
  });
  it("isInRange agrees with requireQuantity (property)", () => {
    const rules = Object.values(INPUT_RULES) as QuantityRule[];
    fc.assert(
      fc.property(fc.constantFrom(...rules), fc.oneof(fc.double(), fc.integer({ min: -100, max: 30000 })), (rule, x) => {
        let threw = false;
        try {
          requireQuantity(rule, x);
        } catch (e) {
          threw = e instanceof CalcInputError;
        }
        return threw === !isInRange(rule, x);
      }),
    );
  });
});
