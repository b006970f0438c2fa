import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { commonRpmGrid, compareRuns, computeRunCurve, interpolateAt } from "@/lib/dyno";
import { expectWithin } from "../calc/helpers";

// ISO 1585 at its own reference conditions (99 kPa dry, 25 °C): the factor is exactly 1, so these
// worked examples check the comparison arithmetic alone.
const reference = { pressureKpa: 99, temperatureC: 25, humidityPercent: 0, standard: "ISO_1585" as const };

describe("linear interpolation between recorded points (worked examples, hand arithmetic)", () => {
  const pts = [
    { rpm: 4000, v: 50 },
    { rpm: 5000, v: 70 },
    { rpm: 6000, v: 65 },
  ];
  it("4250 rpm between 50 and 70 → 55", () => expect(interpolateAt(pts, 4250, (p) => p.v)).toBe(55));
  it("on a recorded point → that point", () => expect(interpolateAt(pts, 5000, (p) => p.v)).toBe(70));
  it("5500 rpm → 67.5", () => expect(interpolateAt(pts, 5500, (p) => p.v)).toBe(67.5));
  it("outside the range → null, never extrapolated", () => {
    expect(interpolateAt(pts, 3999, (p) => p.v)).toBeNull();
    expect(interpolateAt(pts, 6001, (p) => p.v)).toBeNull();
  });
});

describe("common rpm grid", () => {
  it("[3100, 9900] and [3000, 10400] at 250 → 3250 … 9750, 27 speeds (hand count)", () => {
    const g = commonRpmGrid([3100, 9900], [3000, 10400], 250);
    expect(g[0]).toBe(3250);
    expect(g[g.length - 1]).toBe(9750);
    expect(g).toHaveLength(27);
  });
  it("no overlap → empty", () => expect(commonRpmGrid([3000, 5000], [6000, 9000], 250)).toEqual([]));
});

describe("comparing two runs", () => {
  const base = computeRunCurve(
    [
      { rpm: 4000, torqueNm: 80 },
      { rpm: 6000, torqueNm: 100 },
      { rpm: 8000, torqueNm: 90 },
    ],
    reference,
  );
  it("torque 10 % higher everywhere → every delta is 10 % of base and the peak delta is +10 % (worked example)", () => {
    const other = computeRunCurve(
      base.points.map((p) => ({ rpm: p.rpm, torqueNm: p.observedTorqueNm * 1.1 })),
      reference,
    );
    const cmp = compareRuns(base, other, 500);
    expect(cmp.grid.map((g) => g.rpm)).toEqual([4000, 4500, 5000, 5500, 6000, 6500, 7000, 7500, 8000]);
    for (const g of cmp.grid) {
      expectWithin(g.deltaPowerKw, g.basePowerKw * 0.1, 1e-9);
      expectWithin(g.deltaTorqueNm, g.baseTorqueNm * 0.1, 1e-9);
    }
    expectWithin(cmp.peakDelta.powerPercent, 10, 1e-9);
    expectWithin(cmp.peakDelta.torqueNm, 10, 1e-9);
    // base peak power: 90 N·m at 8000 rpm = 75.398 kW (P = T·n·2π/60 000); +10 % → +7.540 kW
    expectWithin(cmp.peakDelta.powerKw, 7.5398, 0.0005);
    expect(cmp.largestGain?.rpm).toBe(8000);
  });
  it("a run against itself: every delta is zero (property)", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 5, max: 200, noNaN: true }), { minLength: 2, maxLength: 20 }), (torques) => {
        const c = computeRunCurve(
          torques.map((torqueNm, i) => ({ rpm: 3000 + i * 400, torqueNm })),
          reference,
        );
        const cmp = compareRuns(c, c, 250);
        for (const g of cmp.grid) expect(g.deltaPowerKw).toBe(0);
        expect(cmp.peakDelta.powerKw).toBe(0);
      }),
    );
  });
});
