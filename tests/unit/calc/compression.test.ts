import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { boostedCompressionRatio, compressionVolumes, staticCompressionRatio, sweptVolumeCc, type CompressionInput } from "@/lib/calc";
import { expectCalcError, expectRelClose, expectWithin } from "./helpers";

const MM_PER_IN = 25.4; // NIST SP 811 B.8, exact
const CC_PER_CUBIC_IN = 16.387064; // NIST SP 811 B.8, exact (2.54³)
const KPA_PER_PSI = 6.894757293168; // NIST SP 811 B.8

/** Worked example in REFERENCE-CHECKS (metric, dish). */
const metric: CompressionInput = {
  boreMm: 86,
  strokeMm: 86,
  chamberCc: 45,
  gasketBoreMm: 87,
  gasketThicknessMm: 1.1,
  deckClearanceMm: 0.2,
  pistonDishCc: 5,
};

describe("sweptVolumeCc", () => {
  it("is π/4 · bore² · stroke (Heywood, ICE Fundamentals, ch. 2)", () => {
    // Heywood ch. 2: Vd = π B² L / 4. 86 × 86 mm → in cm³: π/4 · 8.6² · 8.6
    expectRelClose(sweptVolumeCc(86, 86), (Math.PI / 4) * 8.6 ** 3, 1e-14);
  });
  it("a 1 in × 1 in cylinder sweeps π/4 in³ (NIST SP 811: 1 in³ = 16.387 064 cm³)", () => {
    expectRelClose(sweptVolumeCc(25.4, 25.4), (Math.PI / 4) * CC_PER_CUBIC_IN, 1e-14);
  });
  it("throws CalcInputError for impossible dimensions", () => {
    expectCalcError(() => sweptVolumeCc(0, 86), "boreMm", /> 0; got 0/);
    expectCalcError(() => sweptVolumeCc(-86, 86), "boreMm", /got -86/);
    expectCalcError(() => sweptVolumeCc(86, Number.NaN), "strokeMm", /NaN/);
  });
});

describe("staticCompressionRatio — Heywood ch. 2: CR = (Vs + Vc) / Vc", () => {
  it("metric worked example with a 5 cc dish → 9.6577 (REFERENCE-CHECKS, calc from the formula)", () => {
    expectWithin(staticCompressionRatio(metric), 9.6577, 0.00005);
  });
  it("same engine with a 3 cc dome → 11.0513 (REFERENCE-CHECKS, calc)", () => {
    expectWithin(staticCompressionRatio({ ...metric, pistonDishCc: -3 }), 11.0513, 0.00005);
  });
  it("imperial worked example → 10.585 (published page; the page rounds to 10.60)", () => {
    // bore 4.25 in, stroke 4.0 in, gasket 0.051 in at bore, deck 0.005 in, chamber 64 cc, dish 1.22 in³
    const cr = staticCompressionRatio({
      boreMm: 4.25 * MM_PER_IN,
      strokeMm: 4.0 * MM_PER_IN,
      chamberCc: 64,
      gasketBoreMm: 4.25 * MM_PER_IN,
      gasketThicknessMm: 0.051 * MM_PER_IN,
      deckClearanceMm: 0.005 * MM_PER_IN,
      pistonDishCc: 1.22 * CC_PER_CUBIC_IN,
    });
    expectWithin(cr, 10.585, 0.0005);
  });
  it("breaks down the clearance volume into its parts", () => {
    const v = compressionVolumes(metric);
    // Heywood ch. 2: gasket and deck slices are cylinders π/4 · d² · h
    expectRelClose(v.gasketCc, ((Math.PI / 4) * 87 ** 2 * 1.1) / 1000, 1e-14);
    expectRelClose(v.deckCc, ((Math.PI / 4) * 86 ** 2 * 0.2) / 1000, 1e-14);
    expectRelClose(v.clearanceCc, 45 + v.gasketCc + v.deckCc + 5, 1e-15);
  });

  const geometry = fc
    .record({
      boreMm: fc.double({ min: 30, max: 120, noNaN: true }),
      strokeMm: fc.double({ min: 20, max: 120, noNaN: true }),
      chamberCc: fc.double({ min: 5, max: 120, noNaN: true }),
      gasketBoreMm: fc.double({ min: 30, max: 125, noNaN: true }),
      gasketThicknessMm: fc.double({ min: 0, max: 3, noNaN: true }),
      deckClearanceMm: fc.double({ min: -0.5, max: 1, noNaN: true }),
      pistonDishCc: fc.double({ min: -4, max: 20, noNaN: true }),
    })
    .filter((g) => {
      // keep physically possible builds: clearance volume (Heywood ch. 2) of at least 1 cc
      const slice = (d: number, h: number) => ((Math.PI / 4) * d * d * h) / 1000;
      return g.chamberCc + slice(g.gasketBoreMm, g.gasketThicknessMm) + slice(g.boreMm, g.deckClearanceMm) + g.pistonDishCc >= 1;
    });

  it("CR falls when any clearance component rises (property)", () => {
    fc.assert(
      fc.property(
        geometry,
        fc.constantFrom("chamberCc", "gasketThicknessMm", "deckClearanceMm", "pistonDishCc" as const),
        fc.double({ min: 0.01, max: 10, noNaN: true }),
        (g, field, extra) => {
          const before = staticCompressionRatio(g);
          const after = staticCompressionRatio({ ...g, [field]: g[field] + extra });
          return after < before;
        },
      ),
      { numRuns: 1000 },
    );
  });

  it("CR is always > 1 and rises with stroke (property)", () => {
    fc.assert(
      fc.property(geometry, fc.double({ min: 0.1, max: 20, noNaN: true }), (g, more) => {
        const cr = staticCompressionRatio(g);
        return cr > 1 && staticCompressionRatio({ ...g, strokeMm: g.strokeMm + more }) > cr;
      }),
      { numRuns: 1000 },
    );
  });

  it("throws CalcInputError for impossible geometry", () => {
    expectCalcError(() => staticCompressionRatio({ ...metric, boreMm: 0 }), "boreMm");
    expectCalcError(() => staticCompressionRatio({ ...metric, chamberCc: -1 }), "chamberCc", /≥ 0/);
    expectCalcError(() => staticCompressionRatio({ ...metric, gasketBoreMm: 0 }), "gasketBoreMm");
    expectCalcError(() => staticCompressionRatio({ ...metric, gasketThicknessMm: -0.1 }), "gasketThicknessMm");
    expectCalcError(() => staticCompressionRatio({ ...metric, deckClearanceMm: Number.NaN }), "deckClearanceMm");
    expectCalcError(() => staticCompressionRatio({ ...metric, pistonDishCc: Infinity }), "pistonDishCc");
    // a dome big enough to fill the chamber: zero or negative clearance volume
    const err = expectCalcError(
      () => staticCompressionRatio({ ...metric, pistonDishCc: -100 }),
      "clearance volume (chamberCc + gasket + deck + pistonDishCc)",
      /must be > 0 cc/,
    );
    expect(typeof err.value).toBe("number");
    expectCalcError(() => staticCompressionRatio(null as unknown as CompressionInput), "input", /object/);
  });
});

describe("boostedCompressionRatio — rule of thumb CR × (1 + boost/ambient), common practice", () => {
  const psi = (p: number) => p * KPA_PER_PSI;

  it("8:1 at 10 psi → 13.44 (published page, CR·(1 + psi/14.7))", () => {
    // the page uses 14.7 psi ambient; our default is 101.325 kPa = 14.696 psi (ISO 2533), so ±0.01
    expectWithin(boostedCompressionRatio(8, psi(10)), 13.44, 0.01);
  });
  it("9.5:1 at 10 psi → 15.96 (published page), i.e. near 16:1 (common practice, no source)", () => {
    expectWithin(boostedCompressionRatio(9.5, psi(10)), 15.96, 0.01);
    expectWithin(boostedCompressionRatio(9.5, psi(10)), 16, 0.1);
  });
  it("a stock 12:1 engine at 7 psi beats a 9.5:1 engine at 10 psi (common practice, no source)", () => {
    expect(boostedCompressionRatio(12, psi(7))).toBeGreaterThan(boostedCompressionRatio(9.5, psi(10)));
  });
  it("no boost leaves the static ratio; a custom ambient (altitude) raises the effect of the same boost", () => {
    expect(boostedCompressionRatio(10, 0)).toBe(10);
    expect(boostedCompressionRatio(10, 50, 85)).toBeGreaterThan(boostedCompressionRatio(10, 50));
  });
  it("throws CalcInputError for impossible input", () => {
    expectCalcError(() => boostedCompressionRatio(1, 50), "staticCr", /> 1/);
    expectCalcError(() => boostedCompressionRatio(Number.NaN, 50), "staticCr");
    expectCalcError(() => boostedCompressionRatio(10, Infinity), "boostKpa");
    expectCalcError(() => boostedCompressionRatio(10, -200), "boostKpa", /absolute/);
    expectCalcError(() => boostedCompressionRatio(10, 50, 0), "ambientKpa");
  });
});
