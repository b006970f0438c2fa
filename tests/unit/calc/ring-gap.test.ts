import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { ringGapGuide, type RingGapDuty } from "@/lib/calc";
import { expectCalcError, expectWithin } from "./helpers";

describe("ringGapGuide — top-ring end gap ≈ factor × bore (common practice, no source)", () => {
  it("naturally aspirated: street factor about 0.0045 × bore (common practice, REFERENCE-CHECKS)", () => {
    const g = ringGapGuide(100, "naturally-aspirated");
    expectWithin(g.topRing.minMm, 0.45, 1e-12);
    expect(g.topRing.maxMm).toBeGreaterThan(g.topRing.minMm);
  });
  it("boosted: from about 0.0050 (moderate) to 0.0065 × bore (heavy boost) (common practice)", () => {
    const g = ringGapGuide(100, "boosted");
    expectWithin(g.topRing.minMm, 0.5, 1e-12);
    expectWithin(g.topRing.maxMm, 0.65, 1e-12);
  });
  it("second ring about 1.25 × the top ring (common practice)", () => {
    const g = ringGapGuide(86, "boosted");
    expectWithin(g.secondRing.minMm, 1.25 * g.topRing.minMm, 1e-15);
    expectWithin(g.secondRing.maxMm, 1.25 * g.topRing.maxMm, 1e-15);
  });
  it("always carries a caution deferring to the ring maker, and says it is common practice", () => {
    const g = ringGapGuide(86, "naturally-aspirated");
    expect(g.caution).toMatch(/ring maker/);
    expect(g.basis).toMatch(/[Cc]ommon practice/);
  });
  it("boosted gaps are never tighter than naturally aspirated ones, and scale with bore (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 30, max: 120, noNaN: true }), (bore) => {
        const na = ringGapGuide(bore, "naturally-aspirated");
        const b = ringGapGuide(bore, "boosted");
        return b.topRing.minMm >= na.topRing.minMm && b.topRing.maxMm >= na.topRing.maxMm && na.topRing.minMm > 0;
      }),
    );
  });
  it("throws CalcInputError for impossible input", () => {
    expectCalcError(() => ringGapGuide(0, "boosted"), "boreMm");
    expectCalcError(() => ringGapGuide(-86, "boosted"), "boreMm", /got -86/);
    expectCalcError(() => ringGapGuide(86, "turbo" as RingGapDuty), "duty", /"turbo"/);
  });
});
