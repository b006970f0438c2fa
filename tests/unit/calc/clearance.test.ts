import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { oilClearance, oilClearanceGuide } from "@/lib/calc";
import { expectCalcError, expectWithin } from "./helpers";

describe("oilClearance — bearing bore minus journal diameter", () => {
  it("gives each clearance with min and max (invented readings, mm)", () => {
    const r = oilClearance([44.982, 44.985, 44.979], [45.02, 45.018, 45.026]);
    expect(r.each).toHaveLength(3);
    expectWithin(r.each[0], 0.038, 1e-12);
    expectWithin(r.each[1], 0.033, 1e-12);
    expectWithin(r.each[2], 0.047, 1e-12);
    expect(r.min).toBe(r.each[1]);
    expect(r.max).toBe(r.each[2]);
  });

  it("reports interference (bore smaller than journal) as a negative clearance", () => {
    expect(oilClearance([2.0005], [2.0]).each[0]).toBeLessThan(0);
  });

  it("min ≤ every clearance ≤ max (property)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: 20, max: 60, noNaN: true }), fc.double({ min: 0, max: 0.1, noNaN: true })), {
          minLength: 1,
          maxLength: 10,
        }),
        (pairs) => {
          const r = oilClearance(
            pairs.map(([j]) => j),
            pairs.map(([j, c]) => j + c),
          );
          return r.each.every((c) => c >= r.min && c <= r.max);
        },
      ),
    );
  });

  it("rule of thumb: 0.001 in per inch of journal (common practice, no source)", () => {
    const g = oilClearanceGuide(2.0);
    expectWithin(g.clearance, 0.002, 1e-15);
    expect(g.caution).toMatch(/maker/);
  });

  it("throws CalcInputError for impossible input", () => {
    expectCalcError(() => oilClearance([], []), "journalDiameters", /non-empty/);
    expectCalcError(() => oilClearance([45, 45], [45.03]), "bearingBores", /one reading per journal \(2\)/);
    expectCalcError(() => oilClearance([45, -45], [45.03, 45.03]), "journalDiameters[1]");
    expectCalcError(() => oilClearance([45], [Number.NaN]), "bearingBores[0]", /NaN/);
    expectCalcError(() => oilClearanceGuide(0), "journalDiameter");
  });
});
