import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { evaluateTolerance, type LengthUnit, type ToleranceSpec } from "@/lib/calc";
import { expectCalcError, expectWithin } from "./helpers";

describe("evaluateTolerance", () => {
  const spec: ToleranceSpec = { unit: "mm", nominal: 0.04, min: 0.03, max: 0.05 };

  it("classifies low / in / high with deviation from nominal in the spec's unit", () => {
    expect(evaluateTolerance(0.029, spec).status).toBe("low");
    expect(evaluateTolerance(0.045, spec).status).toBe("in");
    expect(evaluateTolerance(0.051, spec).status).toBe("high");
    expectWithin(evaluateTolerance(0.045, spec).deviation, 0.005, 1e-15);
  });

  it("counts boundary values as in", () => {
    expect(evaluateTolerance(0.03, spec).status).toBe("in");
    expect(evaluateTolerance(0.05, spec).status).toBe("in");
  });

  it("converts the reading's unit: 1 in = 25.4 mm exactly (NIST SP 811 B.8)", () => {
    // 0.001 in = 0.0254 mm exactly: on the max limit, so in — even though 0.001 × 25.4 ≠ 0.0254 in binary
    const r = evaluateTolerance({ value: 0.001, unit: "in" }, { unit: "mm", min: 0.0127, max: 0.0254 });
    expect(r.status).toBe("in");
    expect(evaluateTolerance({ value: 0.0005, unit: "in" }, { unit: "mm", min: 0.0127, max: 0.0254 }).status).toBe("in");
    expect(evaluateTolerance({ value: 25.4, unit: "µm" }, { unit: "in", nominal: 0, max: 0.001 }).status).toBe("in");
    const dev = evaluateTolerance({ value: 50, unit: "µm" }, spec).deviation;
    expectWithin(dev, 0.01, 1e-15);
  });

  it("never rounds: a hair over the limit is high", () => {
    expect(evaluateTolerance(0.0500000001, spec).status).toBe("high");
    expect(evaluateTolerance({ value: 50.0000001, unit: "µm" }, spec).status).toBe("high");
    expect(evaluateTolerance({ value: 0.00100000001, unit: "in" }, { unit: "mm", nominal: 0, max: 0.0254 }).status).toBe("high");
    // 1 part in 10¹³ over: below floating-point conversion noise, still decided exactly
    expect(evaluateTolerance({ value: 0.0010000000000001, unit: "in" }, { unit: "mm", nominal: 0, max: 0.0254 }).status).toBe("high");
    expect(evaluateTolerance({ value: 0.0009999999999999, unit: "in" }, { unit: "mm", min: 0.0254, max: 1 }).status).toBe("low");
  });

  it("defaults the nominal to the midpoint of min and max, and takes one-sided specs with a nominal", () => {
    expectWithin(evaluateTolerance(0.04, { unit: "mm", min: 0.03, max: 0.05 }).nominal, 0.04, 1e-15);
    expect(evaluateTolerance(0.06, { unit: "mm", nominal: 0, max: 0.05 }).status).toBe("high");
    expect(evaluateTolerance(85.9, { unit: "mm", nominal: 86, min: 86 }).status).toBe("low");
  });

  const units: LengthUnit[] = ["mm", "in", "µm"];
  /** k ten-thousandths of an inch written in unit u (integer ÷ power of ten: the nearest double to the exact decimal). */
  const inUnit = (k: number, u: LengthUnit) => (u === "in" ? k / 10000 : u === "µm" ? (k * 254) / 100 : (k * 254) / 100000);

  it("a reading equal to a limit is in, in every unit pairing (property, exact inch ratio NIST SP 811)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 200000 }), fc.constantFrom(...units), fc.constantFrom(...units), (k, vu, su) => {
        // k ten-thousandths of an inch, written in each unit as a short exact decimal
        const value = inUnit(k, vu);
        const limit = inUnit(k, su);
        if (String(value).length > 16 || String(limit).length > 16) return true; // not a short decimal
        const atMax = evaluateTolerance({ value, unit: vu }, { unit: su, nominal: 0, max: limit });
        const atMin = evaluateTolerance({ value, unit: vu }, { unit: su, nominal: limit * 2, min: limit });
        return atMax.status === "in" && atMin.status === "in";
      }),
      { numRuns: 3000 },
    );
  });

  it("status agrees with the plain comparison away from the limits (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: -1, max: 1, noNaN: true }), (v) => {
        const s = evaluateTolerance(v, { unit: "mm", min: -0.5, max: 0.5 }).status;
        return s === (v < -0.5 ? "low" : v > 0.5 ? "high" : "in");
      }),
    );
  });

  it("throws CalcInputError for impossible input", () => {
    expectCalcError(() => evaluateTolerance(Number.NaN, spec), "measured", /NaN/);
    expectCalcError(() => evaluateTolerance({ value: 1, unit: "cm" as LengthUnit }, spec), "measured.unit", /"cm"/);
    expectCalcError(() => evaluateTolerance({ value: Infinity, unit: "mm" }, spec), "measured.value");
    expectCalcError(() => evaluateTolerance(1, { ...spec, unit: "thou" as LengthUnit }), "spec.unit");
    expectCalcError(() => evaluateTolerance(1, { unit: "mm", nominal: 1 }), "spec", /min, max or both/);
    expectCalcError(() => evaluateTolerance(1, { unit: "mm", min: 2, max: 1 }), "spec.min", /must not exceed/);
    expectCalcError(() => evaluateTolerance(1, { unit: "mm", nominal: 3, min: 0, max: 2 }), "spec.nominal", /within the limits/);
    expectCalcError(() => evaluateTolerance(1, { unit: "mm", max: 2 }), "spec.nominal", /required/);
    expectCalcError(() => evaluateTolerance(1, { unit: "mm", min: Number.NaN, max: 2 }), "spec.min");
  });
});
