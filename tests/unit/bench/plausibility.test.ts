import { describe, expect, it } from "vitest";
import { readingPlausibility, wrenchPlausibility } from "@/lib/bench/plausibility";

// The demo bottom-end template's figures (invented examples): bore 75.995–76.015 mm, ring gap 0.35–0.48 mm.
const bore = { unit: "mm" as const, min: 75.995, max: 76.015, nominal: 76 };
const ringGap = { unit: "mm" as const, min: 0.35, max: 0.48, nominal: 0.4 };

describe("is the value one the spec can physically be", () => {
  it("takes ordinary readings, in or out of tolerance, without a question", () => {
    expect(readingPlausibility("76.004", bore)).toEqual({ kind: "ok" });
    expect(readingPlausibility("76.030", bore)).toEqual({ kind: "ok" }); // high, but a real worn bore
    expect(readingPlausibility("0.52", ringGap)).toEqual({ kind: "ok" });
  });

  it("asks before saving a negative length, a zero, or a reading far outside the limits", () => {
    expect(readingPlausibility("-76", bore)).toMatchObject({ kind: "confirm", reasons: [expect.stringContaining("below zero")] });
    expect(readingPlausibility("0", bore)).toMatchObject({ kind: "confirm", reasons: [expect.stringContaining("A reading of zero")] });
    expect(readingPlausibility("7.6004", bore)).toMatchObject({ kind: "confirm", reasons: [expect.stringContaining("far below")] });
    expect(readingPlausibility("760.04", bore)).toMatchObject({ kind: "confirm", reasons: [expect.stringContaining("far above")] });
    expect(readingPlausibility("4.8", ringGap)).toMatchObject({ kind: "confirm" });
  });

  it("does not question a negative value where the spec itself goes below zero (a deck height)", () => {
    expect(readingPlausibility("-0.05", { unit: "mm", min: -0.1, max: 0.1, nominal: 0 })).toEqual({ kind: "ok" });
  });

  it("refuses what the wire format refuses, with the same words", () => {
    expect(readingPlausibility("99999", bore)).toEqual({
      kind: "refuse",
      reason: "Value: 99999 mm is beyond anything on an engine (the most is 2000 mm); check the instrument and type it again.",
    });
  });

  it("questions a wrench reading far from the pass's target, in the unit it was read in", () => {
    const target = { value: 10, unit: "N·m" as const };
    expect(wrenchPlausibility(10.4, "N·m", target)).toEqual({ kind: "ok" });
    expect(wrenchPlausibility(16, "N·m", target)).toMatchObject({ kind: "confirm", reasons: [expect.stringContaining("far above")] });
    expect(wrenchPlausibility(6, "N·m", target)).toMatchObject({ kind: "confirm", reasons: [expect.stringContaining("well below")] });
    // 7.376 lbf·ft is 10 N·m (1 lbf·ft = 1.3558179483314 N·m, NIST SP 811): on target in the other unit
    expect(wrenchPlausibility(7.4, "lbf·ft", target)).toEqual({ kind: "ok" });
    expect(wrenchPlausibility(12, "N·m", null)).toEqual({ kind: "ok" }); // an angle pass has no torque target
  });

  it("refuses an absurd wrench reading: 99999 N·m against a 10 N·m target", () => {
    expect(wrenchPlausibility(99999, "N·m", { value: 10, unit: "N·m" })).toMatchObject({
      kind: "refuse",
      reason: expect.stringContaining("beyond any fastener"),
    });
    expect(wrenchPlausibility(0, "N·m", null)).toMatchObject({ kind: "refuse" });
  });
});
