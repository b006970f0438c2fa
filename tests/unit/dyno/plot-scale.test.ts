import { describe, expect, it } from "vitest";
import { niceAxis, niceStep } from "@/lib/dyno";

// Tick spacing of 1, 2, 2.5 or 5 × 10ⁿ: common practice, no source; checks are hand arithmetic.
describe("plot axes", () => {
  it("span 137 with 5 ticks → step 50", () => expect(niceStep(137, 5)).toBe(50));
  it("span 11 with 5 ticks → step 2.5", () => expect(niceStep(11, 5)).toBe(2.5));
  it("3100 … 10350 rpm → 2000 … 12000 by 2000", () => {
    expect(niceAxis(3100, 10350, 5)).toEqual({ min: 2000, max: 12000, ticks: [2000, 4000, 6000, 8000, 10000, 12000] });
  });
  it("a flat range still gets an axis", () => expect(niceAxis(5, 5).ticks.length).toBeGreaterThan(1));
});
