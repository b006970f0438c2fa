import { describe, expect, it } from "vitest";
import { markPoints } from "@/lib/dyno";

const run = { boostTargetKpa: 68.95, stoichiometricAfr: 14.7 };

describe("lean and over-boost points (limits: common practice defaults, λ 0.85 and 7 kPa over target)", () => {
  it("marks λ above the limit on boost, and boost more than the margin over the target", () => {
    const marks = markPoints(
      [
        { rpm: 3000, lambda: 0.95, boostKpa: -20 }, // lean figure but off boost: not marked
        { rpm: 5000, lambda: 0.8, boostKpa: 60 },
        { rpm: 7000, lambda: 0.9, boostKpa: 70 }, // lean on boost
        { rpm: 8000, lambda: 0.84, boostKpa: 80 }, // 80 > 68.95 + 7: over-boost
        { rpm: 9000, lambda: 0.85, boostKpa: 75.95 }, // exactly at both limits: not marked
      ],
      run,
    );
    expect(marks.map((m) => [m.kind, m.rpm])).toEqual([
      ["lean", 7000],
      ["over-boost", 8000],
    ]);
    // AFR beside lambda: 0.9 × 14.7 = 13.23 → 13.2
    expect(marks[0].message).toBe("Lean at 7000 rpm: λ 0.9 (AFR 13.2), leaner than the λ 0.85 limit.");
    // 80 kPa = 11.6 psi (÷ 6.894 757); 80 − 68.95 = 11.05, shown to 0.1 kPa as 11 (binary 11.0499…)
    expect(marks[1].message).toBe("Over-boost at 8000 rpm: 80 kPa (11.6 psi), 11 kPa over the 69 kPa target.");
  });
  it("without boost logged, every lean point counts (a full-load pull)", () => {
    expect(markPoints([{ rpm: 6000, lambda: 0.9, boostKpa: null }], run)).toHaveLength(1);
  });
  it("the limits are the tuner's", () => {
    expect(markPoints([{ rpm: 6000, lambda: 0.9, boostKpa: 75 }], run, { leanAboveLambda: 0.95, overBoostMarginKpa: 10 })).toEqual([]);
  });
});
