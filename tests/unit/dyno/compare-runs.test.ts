import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { commonRpmGrid, compareAtSameRpm, compareRuns, computeRunCurve, interpolateAt, summariseRun } from "@/lib/dyno";
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

describe("runs compared at one standard and at the same rpm, boost beside power", () => {
  const stored = (id: string, standard: "SAE_J1349" | "DIN_70020", boostPsi: number, torque: number[], boost?: number[]) => ({
    id,
    label: id,
    ranOn: "2026-12-01",
    boostTarget: boostPsi,
    boostUnit: "psi" as const,
    pressureKpa: 95,
    temperatureC: 30,
    humidityPercent: 0,
    standard,
    torqueUnit: "N·m" as const,
    notes: "",
    fuel: null,
    tune: null,
    channels: boost ? [{ channel: "boost" as const, unit: "kPa", sourceColumn: "MAP" }] : [],
    points: [4000, 6000, 8000].map((rpm, i) => ({ rpm, torque: torque[i], ...(boost ? { logged: { boost: boost[i] } } : {}) })),
    withdrawn: null,
  });
  const a = stored("A", "SAE_J1349", 7, [80, 100, 90], [40, 48, 48]);
  const b = stored("B", "DIN_70020", 10, [80, 100, 90], [60, 69, 69]);

  it("the same pull recorded under two standards shows a gain at their own standards, none at one", () => {
    const own = compareRuns(summariseRun(a).curve, summariseRun(b).curve, 1000);
    // DIN 70020 at 95 kPa total, 30 °C: 1013/950·√(303/293) = 1.0844; J1349 1990 at 95 kPa dry: 1.18·(990/950)·√(303/298) − 0.18 = 1.0600 (calc)
    expect(own.peakDelta.powerPercent).toBeGreaterThan(2);
    const one = compareAtSameRpm(summariseRun(a, "SAE_J1349_CURRENT"), summariseRun(b, "SAE_J1349_CURRENT"), 1000);
    expect(one.peakDelta.powerKw).toBe(0);
    expect(one.rows.map((r) => r.deltaPowerKw)).toEqual([0, 0, 0, 0, 0]);
    expect(one.correctedTo).toBe("SAE_J1349_CURRENT");
  });
  it("gives the boost difference at each rpm beside the power difference, and the targets' difference", () => {
    const d = compareAtSameRpm(summariseRun(a, "ISO_1585"), summariseRun(b, "ISO_1585"), 1000);
    expect(d.rows.map((r) => [r.rpm, r.deltaBoostKpa])).toEqual([
      [4000, 20],
      [5000, 20.5], // between 48−40 … read at 5000: a 44, b 64.5
      [6000, 21],
      [7000, 21],
      [8000, 21],
    ]);
    // 3 psi × 6.894 757 kPa (NIST SP 811) = 20.684 kPa
    expectWithin(d.deltaBoostTargetKpa, 20.684272, 1e-6);
  });
  it("refuses two runs corrected to different standards", () => {
    expect(() => compareAtSameRpm(summariseRun(a), summariseRun(b))).toThrow(/one standard/);
  });
});
