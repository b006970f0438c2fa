import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { boltLayout, MAX_BOLT_COUNT, tighteningSequence, type TighteningPattern } from "@/lib/calc";
import { expectCalcError } from "./helpers";

const isPermutation = (seq: number[], n: number) => seq.length === n && [...seq].sort((a, b) => a - b).every((b, i) => b === i + 1);

/** Steps clockwise from bolt a to bolt b on an N-bolt circle, folded to the shorter way (0 … N/2). */
const circleSteps = (a: number, b: number, n: number) => {
  const d = (((b - a) % n) + n) % n;
  return Math.min(d, n - d);
};

describe("'cross' — ASME PCC-1 legacy cross pattern (from memory: the standard's text is licensed)", () => {
  it("4 bolts → 1-3-2-4", () => expect(tighteningSequence("cross", 4)).toEqual([1, 3, 2, 4]));
  it("8 bolts → 1-5-3-7-2-6-4-8", () => expect(tighteningSequence("cross", 8)).toEqual([1, 5, 3, 7, 2, 6, 4, 8]));
  it("12 bolts → 1-7-4-10-2-8-5-11-3-9-6-12", () =>
    expect(tighteningSequence("cross", 12)).toEqual([1, 7, 4, 10, 2, 8, 5, 11, 3, 9, 6, 12]));
  it("16 bolts → 1-9-5-13-3-11-7-15-2-10-6-14-4-12-8-16", () =>
    expect(tighteningSequence("cross", 16)).toEqual([1, 9, 5, 13, 3, 11, 7, 15, 2, 10, 6, 14, 4, 12, 8, 16]));

  const count = fc.integer({ min: 2, max: 200 });

  it("is a permutation of 1..N starting at bolt 1, for any N ≥ 2 (property)", () => {
    fc.assert(
      fc.property(count, (n) => {
        const seq = tighteningSequence("cross", n);
        return isPermutation(seq, n) && seq[0] === 1;
      }),
    );
  });

  // The property we hold the cross pattern to. "Every move ≥ 90°" is NOT it: PCC-1's own 16-bolt
  // legacy order goes 15 → 2, only 67.5° apart. What the legacy orders do keep, and we keep for
  // every N: (a) even N — bolts are taken in pairs, the second of each pair exactly opposite the
  // first (180°), so the load is balanced after every pair; (b) N = 2^k·m (m odd) — the first 2^j
  // bolts (j ≤ k) sit evenly round the flange (2 opposite, then a square, then an octagon…);
  // (c) odd N — no bolt is opposite another, so every move is the nearest-to-opposite step of
  // (N−1)/2 bolts (180°·(N−1)/N ≥ 120°).
  it("(a) even N: every second bolt is diametrically opposite the one before it (property)", () => {
    fc.assert(
      fc.property(
        count.map((n) => 2 * Math.ceil(n / 2)),
        (n) => {
          const seq = tighteningSequence("cross", n);
          for (let i = 0; i < n; i += 2) if (circleSteps(seq[i], seq[i + 1], n) !== n / 2) return false;
          return true;
        },
      ),
    );
  });

  it("(b) N = 2^k·m: the first 2^j bolts are evenly spaced for every j ≤ k (property)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 6 }), fc.integer({ min: 0, max: 7 }), (k, mHalf) => {
        const m = 2 * mHalf + 1;
        const n = 2 ** k * m;
        const seq = tighteningSequence("cross", n);
        for (let j = 1; j <= k; j++) {
          const first = seq.slice(0, 2 ** j).sort((a, b) => a - b);
          const gap = n / 2 ** j;
          if (!first.every((b, i) => b === 1 + i * gap)) return false;
        }
        return true;
      }),
    );
  });

  it("(c) odd N: every move is (N−1)/2 bolts round, the nearest to opposite (property)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 100 }), (h) => {
        const n = 2 * h + 1;
        const seq = tighteningSequence("cross", n);
        return seq.every((b, i) => i === 0 || circleSteps(seq[i - 1], b, n) === (n - 1) / 2);
      }),
    );
  });

  it("odd counts form a star: 5 → 1-3-5-2-4 (pentagram)", () => {
    expect(tighteningSequence("cross", 5)).toEqual([1, 3, 5, 2, 4]);
  });
});

describe("'spiral-out' — two-row head, centre first (our convention, see the doc comment)", () => {
  it("10 bolts (1 2 3 4 5 over 10 9 8 7 6) → 3-8-2-7-4-9-5-10-1-6, as documented", () => {
    expect(tighteningSequence("spiral-out", 10)).toEqual([3, 8, 2, 7, 4, 9, 5, 10, 1, 6]);
  });

  const even = fc.integer({ min: 1, max: 100 }).map((h) => 2 * h);
  /** Column (0-based, left → right) and row of a bolt under the documented numbering. */
  const place = (bolt: number, n: number) => (bolt <= n / 2 ? { column: bolt - 1, row: "intake" } : { column: n - bolt, row: "exhaust" });
  /** Distance of a column from the head's centre line, in column pitches. */
  const fromCentre = (column: number, n: number) => Math.abs(column - (n / 2 - 1) / 2);

  it("is a permutation of 1..N (property)", () => {
    fc.assert(fc.property(even, (n) => isPermutation(tighteningSequence("spiral-out", n), n)));
  });
  it("starts at the centre: the first bolt is in a centre column (property)", () => {
    fc.assert(fc.property(even, (n) => fromCentre(place(tighteningSequence("spiral-out", n)[0], n).column, n) <= 0.5));
  });
  it("works outwards: distance from the centre never decreases along the sequence (property)", () => {
    fc.assert(
      fc.property(even, (n) => {
        const d = tighteningSequence("spiral-out", n).map((b) => fromCentre(place(b, n).column, n));
        return d.every((x, i) => i === 0 || x >= d[i - 1]);
      }),
    );
  });
  it("alternates sides: each move crosses from one row to the other (property)", () => {
    fc.assert(
      fc.property(even, (n) => {
        const rows = tighteningSequence("spiral-out", n).map((b) => place(b, n).row);
        return rows.every((r, i) => i === 0 || r !== rows[i - 1]);
      }),
    );
  });
});

describe("'linear'", () => {
  it("is 1..N in order", () => {
    expect(tighteningSequence("linear", 5)).toEqual([1, 2, 3, 4, 5]);
    expect(tighteningSequence("linear", 1)).toEqual([1]);
  });
});

describe("boltLayout", () => {
  const patterns: TighteningPattern[] = ["cross", "spiral-out", "linear"];
  const anyLayout = fc.tuple(fc.constantFrom(...patterns), fc.integer({ min: 1, max: 60 })).map(([p, h]) => [p, 2 * h] as const);

  it("gives every bolt once, in bolt order, inside the unit box (property)", () => {
    fc.assert(
      fc.property(anyLayout, ([p, n]) => {
        const layout = boltLayout(p, n);
        return layout.length === n && layout.every((b, i) => b.bolt === i + 1 && b.x >= 0 && b.x <= 1 && b.y >= 0 && b.y <= 1);
      }),
    );
  });
  it("'cross' puts bolt 1 at 12 o'clock and numbers clockwise on screen (y down)", () => {
    const layout = boltLayout("cross", 8);
    expect(layout[0].x).toBeCloseTo(0.5, 12);
    expect(layout[0].y).toBeCloseTo(0.1, 12);
    // bolt 3 of 8 is at 3 o'clock: right of centre
    expect(layout[2].x).toBeCloseTo(0.9, 12);
    expect(layout[2].y).toBeCloseTo(0.5, 12);
    // opposite bolts in the sequence are mirror images through the centre
    const seq = tighteningSequence("cross", 8);
    const a = layout[seq[0] - 1];
    const b = layout[seq[1] - 1];
    expect(a.x + b.x).toBeCloseTo(1, 12);
    expect(a.y + b.y).toBeCloseTo(1, 12);
  });
  it("'spiral-out' draws intake row left → right on top, exhaust row right → left below", () => {
    const layout = boltLayout("spiral-out", 6);
    expect(layout.slice(0, 3).map((b) => b.y)).toEqual([0.35, 0.35, 0.35]);
    expect(layout.slice(3).map((b) => b.y)).toEqual([0.65, 0.65, 0.65]);
    expect(layout[0].x).toBeLessThan(layout[1].x);
    expect(layout[3].x).toBeGreaterThan(layout[4].x);
    // bolt 4 (first exhaust bolt) sits under bolt 3 (last intake bolt): clockwise numbering
    expect(layout[3].x).toBe(layout[2].x);
  });
});

describe("tighteningSequence / boltLayout errors", () => {
  it("throws CalcInputError for impossible input", () => {
    expectCalcError(() => tighteningSequence("zigzag" as TighteningPattern, 8), "pattern", /"zigzag"/);
    expectCalcError(() => tighteningSequence("cross", 1), "boltCount", /from 2/);
    expectCalcError(() => tighteningSequence("cross", 6.5), "boltCount", /integer/);
    expectCalcError(() => tighteningSequence("cross", Number.NaN), "boltCount");
    expectCalcError(() => tighteningSequence("cross", MAX_BOLT_COUNT + 1), "boltCount");
    expectCalcError(() => tighteningSequence("spiral-out", 7), "boltCount", /even/);
    expectCalcError(() => tighteningSequence("linear", 0), "boltCount");
    expectCalcError(() => boltLayout("spiral-out", 9), "boltCount", /even/);
    expectCalcError(() => boltLayout("star" as TighteningPattern, 9), "pattern");
  });
});
