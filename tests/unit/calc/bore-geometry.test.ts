import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { boreGeometry, type BoreReadings } from "@/lib/calc";
import { expectCalcError, expectWithin } from "./helpers";

describe("boreGeometry — out-of-round per depth, taper per axis (engine service references)", () => {
  // REFERENCE-CHECKS [page definitions, calc]: top 4.0035/4.0020, middle 4.0025/4.0018,
  // bottom 4.0015/4.0012 in (thrust/pin) → out-of-round 0.0015, taper 0.0020
  const readings: BoreReadings = {
    top: { thrust: 4.0035, pin: 4.002 },
    middle: { thrust: 4.0025, pin: 4.0018 },
    bottom: { thrust: 4.0015, pin: 4.0012 },
  };

  it("worked example: out-of-round 0.0015 in, taper 0.0020 in", () => {
    const g = boreGeometry(readings);
    expectWithin(g.outOfRound.max, 0.0015, 1e-12);
    expectWithin(g.taper.max, 0.002, 1e-12);
    expectWithin(g.taper.thrust, 0.002, 1e-12);
    expectWithin(g.taper.pin, 0.0008, 1e-12);
    expectWithin(g.outOfRound.top, 0.0015, 1e-12);
    expectWithin(g.outOfRound.middle, 0.0007, 1e-12);
    expectWithin(g.outOfRound.bottom, 0.0003, 1e-12);
    expect(g.largest).toBe(4.0035);
    expect(g.smallest).toBe(4.0012);
  });

  it("a perfect cylinder has no taper and no out-of-round", () => {
    const d = { thrust: 86.0, pin: 86.0 };
    const g = boreGeometry({ top: d, middle: d, bottom: d });
    expect(g.taper.max).toBe(0);
    expect(g.outOfRound.max).toBe(0);
  });

  const reading = fc.double({ min: 40, max: 110, noNaN: true });
  const depth = fc.record({ thrust: reading, pin: reading });
  const bore = fc.record({ top: depth, middle: depth, bottom: depth });

  it("taper and out-of-round are ≥ 0, bounded by the spread of readings, and unchanged by swapping thrust and pin (property)", () => {
    fc.assert(
      fc.property(bore, (r) => {
        const g = boreGeometry(r);
        const swap = (d: { thrust: number; pin: number }) => ({ thrust: d.pin, pin: d.thrust });
        const s = boreGeometry({ top: swap(r.top), middle: swap(r.middle), bottom: swap(r.bottom) });
        const spread = g.largest - g.smallest;
        return (
          g.taper.max >= 0 &&
          g.outOfRound.max >= 0 &&
          g.taper.max <= spread &&
          g.outOfRound.max <= spread &&
          s.taper.max === g.taper.max &&
          s.outOfRound.max === g.outOfRound.max
        );
      }),
    );
  });

  it("throws CalcInputError for impossible readings", () => {
    expectCalcError(() => boreGeometry({ ...readings, middle: { thrust: 0, pin: 4 } }), "readings.middle.thrust");
    expectCalcError(() => boreGeometry({ ...readings, bottom: { thrust: 4, pin: Number.NaN } }), "readings.bottom.pin", /NaN/);
    expectCalcError(() => boreGeometry({ top: readings.top, middle: readings.middle } as BoreReadings), "readings.bottom", /object/);
    expectCalcError(() => boreGeometry(null as unknown as BoreReadings), "readings");
  });
});
