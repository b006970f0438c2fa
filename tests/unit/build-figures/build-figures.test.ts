import { describe, expect, it } from "vitest";
import { buildFiguresFromReadings, checkBuildSheet, readingKindOf, type BuildReading, type BuildSheet } from "@/lib/build-figures";
import { expectWithin } from "../calc/helpers";

const KPA_PER_PSI = 6.894757293168; // NIST SP 811 B.8
const CC_PER_CUBIC_INCH = 16.387064; // exact: 25.4³ mm³

const sheet = (figures: BuildSheet["figures"]): BuildSheet => ({ figures, fuel: null, mapOutline: null });

// Heywood, Internal Combustion Engine Fundamentals, ch. 2: CR = (Vs + Vc) / Vc, Vc = chamber + gasket + deck + dish.
// Worked example in REFERENCE-CHECKS ("Static CR", calc): bore 86, stroke 86, chamber 45 cc, gasket 87 × 1.1 mm,
// deck 0.2 mm, dish 5 cc → 9.6577.
const metricReadings: BuildReading[] = [
  { specKey: "bore-1", value: 86.004, unit: "mm" },
  { specKey: "bore-1", value: 85.996, unit: "mm" },
  { specKey: "chamber-volume-cyl-1", value: 45, unit: "cc" },
  { specKey: "deck-clearance", value: 0.2, unit: "mm" },
  { specKey: "gasket-thickness", value: 1.1, unit: "mm" },
  { specKey: "ring-gap", value: 0.3, unit: "mm" },
];

describe("buildFiguresFromReadings — the build's own compression figures", () => {
  it("metric worked example: 86 × 86, 45 cc, 87 × 1.1 gasket, 0.2 deck, 5 cc dish → 9.6577 (REFERENCE-CHECKS, Heywood ch. 2, calc)", () => {
    const f = buildFiguresFromReadings({
      readings: metricReadings,
      sheet: sheet({ strokeMm: 86, gasketBoreMm: 87, pistonDishCc: 5, targetCompressionRatio: 9.5 }),
    });
    expectWithin(f.compressionRatio!, 9.6577, 0.00005);
    expect(f.targetCompressionRatio).toBe(9.5);
    // bore is the mean of two readings; stroke from the build sheet
    expect(f.used.find((u) => u.label === "Bore")).toMatchObject({ source: { kind: "readings", count: 2 } });
    expectWithin(f.used.find((u) => u.label === "Bore")!.value, 86, 1e-9);
    expect(f.used.find((u) => u.label === "Stroke")).toMatchObject({ value: 86, source: { kind: "build sheet" } });
    // a ring gap is not a compression figure
    expect(f.used.some((u) => u.value === 0.3)).toBe(false);
  });

  it("a 3 cc dome instead of the dish → 11.0513 (REFERENCE-CHECKS, calc)", () => {
    const f = buildFiguresFromReadings({ readings: metricReadings, sheet: sheet({ strokeMm: 86, gasketBoreMm: 87, pistonDishCc: -3 }) });
    expectWithin(f.compressionRatio!, 11.0513, 0.00005);
  });

  it("imperial readings: 4.25 in bore, 4.0 in stroke, 0.051 in gasket, 0.005 in deck, 64 cc, 1.22 in³ dish → 10.585 (REFERENCE-CHECKS imperial worked example, page)", () => {
    const f = buildFiguresFromReadings({
      readings: [
        { specKey: "bore", value: 4.25, unit: "in" },
        { specKey: "stroke", value: 4.0, unit: "in" },
        { specKey: "gasket-thickness", value: 0.051, unit: "in" },
        { specKey: "deck-clearance", value: 0.005, unit: "in" },
        { specKey: "chamber-volume", value: 64, unit: "cc" },
      ],
      // the page's gasket is "at bore": gasket bore = bore
      sheet: sheet({ gasketBoreMm: 4.25 * 25.4, pistonDishCc: 1.22 * CC_PER_CUBIC_INCH }),
    });
    expectWithin(f.compressionRatio!, 10.585, 0.0005);
  });

  it("boosted figure: 9.5:1 at 10 psi → 15.96 by CR × (1 + psi/14.7) (REFERENCE-CHECKS, common practice rule of thumb)", () => {
    // choose a dish that makes the static ratio exactly 9.5 for the metric build: Vc = Vs / 8.5
    const swept = ((Math.PI / 4) * 86 * 86 * 86) / 1000;
    const others = 45 + ((Math.PI / 4) * 87 * 87 * 1.1) / 1000 + ((Math.PI / 4) * 86 * 86 * 0.2) / 1000;
    const f = buildFiguresFromReadings({
      readings: metricReadings,
      sheet: sheet({ strokeMm: 86, gasketBoreMm: 87, pistonDishCc: swept / 8.5 - others }),
      boostKpa: 10 * KPA_PER_PSI,
      stationPressureKpa: 14.7 * KPA_PER_PSI,
    });
    expectWithin(f.compressionRatio!, 9.5, 1e-9);
    expectWithin(f.boostedCompressionRatio!, 15.96, 0.005);
  });

  it("dynamic ratio: 76 × 55, rod 110, static 9.5, intake closes 45° ABDC → 8.5229 (REFERENCE-CHECKS, Heywood eq. 2.5, calc)", () => {
    const swept = ((Math.PI / 4) * 76 * 76 * 55) / 1000;
    const gasketAndDeck = ((Math.PI / 4) * 77 * 77 * 0.7) / 1000 + ((Math.PI / 4) * 76 * 76 * 0.2) / 1000;
    const f = buildFiguresFromReadings({
      readings: [
        { specKey: "bore-1", value: 76, unit: "mm" },
        { specKey: "stroke", value: 55, unit: "mm" },
        { specKey: "deck-clearance", value: 0.2, unit: "mm" },
        { specKey: "deck-clearance", value: 0.35, unit: "mm" },
        { specKey: "gasket-thickness", value: 0.7, unit: "mm" },
      ],
      sheet: sheet({
        gasketBoreMm: 77,
        chamberCc: 12,
        // dish chosen so the static ratio is 9.5 with the mean deck of 0.275 mm
        pistonDishCc: swept / 8.5 - 12 - gasketAndDeck - ((Math.PI / 4) * 76 * 76 * 0.075) / 1000,
        rodLengthMm: 110,
        intakeClosesDegAbdc: 45,
        boostKpa: 100,
      }),
    });
    expectWithin(f.compressionRatio!, 9.5, 1e-9);
    expectWithin(f.dynamicCompressionRatio!, 8.5229, 0.00005);
    expectWithin(f.boostedDynamicCompressionRatio!, 8.5229 * ((101.325 + 100) / 101.325), 0.0001);
    // squish from the tightest cylinder: 0.7 gasket + 0.2 deck (common practice: compressed gasket + piston-to-deck)
    expectWithin(f.squishMm!, 0.9, 1e-12);
    expect(f.used.find((u) => u.label === "Chamber volume")?.source.kind).toBe("build sheet");
  });

  it("says what is missing instead of guessing, and names a reading in the wrong kind of unit", () => {
    const f = buildFiguresFromReadings({
      readings: [
        { specKey: "bore-1", value: 76, unit: "mm" },
        { specKey: "chamber-volume", value: 0.5, unit: "mm" },
      ],
      sheet: sheet({}),
    });
    expect(f.compressionRatio).toBeNull();
    expect(f.missing[0]).toBe(
      "Compression ratio: needs stroke, chamber volume, gasket bore, compressed gasket thickness, piston to deck, piston dish.",
    );
    expect(f.problems[0]).toMatch(/^Chamber volume: the reading of chamber-volume is in mm, not cc; left out\.$/);
  });

  it("a piston that would hit the head is a problem in words, not a figure", () => {
    const f = buildFiguresFromReadings({
      readings: [
        { specKey: "deck-clearance", value: -1.2, unit: "mm" },
        { specKey: "gasket-thickness", value: 0.7, unit: "mm" },
      ],
      sheet: sheet({}),
    });
    expect(f.squishMm).toBeNull();
    expect(f.problems.join(" ")).toMatch(/Squish clearance must be more than 0 mm: the piston would hit the head/);
  });

  it("finds reading kinds by spec key", () => {
    expect(readingKindOf("bore")).toBe("bore");
    expect(readingKindOf("bore-3")).toBe("bore");
    expect(readingKindOf("boredom")).toBeNull();
    expect(readingKindOf("deck-clearance-cyl-2")).toBe("deck-clearance");
  });
});

describe("checkBuildSheet — every figure with its unit and range, in workshop words", () => {
  it("keeps good figures and a map outline", () => {
    const r = checkBuildSheet({
      figures: { targetCompressionRatio: 9.2, rodLengthMm: 110 },
      fuel: "E85",
      mapOutline: {
        flowUnit: "lb/min",
        surgeLine: [
          { correctedFlow: 5, pressureRatio: 1.5 },
          { correctedFlow: 10, pressureRatio: 2.5 },
        ],
        chokeLine: [
          { correctedFlow: 25, pressureRatio: 1.5 },
          { correctedFlow: 28, pressureRatio: 2.5 },
        ],
      },
    });
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.sheet.figures).toEqual({ targetCompressionRatio: 9.2, rodLengthMm: 110 });
      expect(r.sheet.mapOutline?.surgeLine).toHaveLength(2);
    }
  });

  it("refuses every bad figure at once, naming the field as the form shows it", () => {
    const r = checkBuildSheet({
      figures: { rodLengthMm: -5, volumetricEfficiencyPercent: Number.NaN, injectors: 2.5, secret: 1, rpmFrom: 9000, rpmTo: 3000 },
      fuel: "diesel",
      mapOutline: { flowUnit: "lb/min", surgeLine: [{ correctedFlow: 5, pressureRatio: 1.5 }], chokeLine: [] },
    });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const byPath = Object.fromEntries(r.issues.map((i) => [i.path, i.message]));
    expect(byPath["figures.rodLengthMm"]).toBe("Rod length (centre to centre) must be between 20 and 600 mm; got -5 mm.");
    expect(byPath["figures.volumetricEfficiencyPercent"]).toBe(
      "Volumetric efficiency must be more than 0 and at most 150 %; got something that is not a number.",
    );
    expect(byPath["figures.injectors"]).toMatch(/^Number of injectors must be a whole number from 1 to 32/);
    expect(byPath["figures.secret"]).toBe("Not a build sheet figure.");
    expect(byPath["figures.rpmTo"]).toMatch(/^Rev range to must be above rev range from/);
    expect(byPath.fuel).toMatch(/^Fuel must be one of petrol, E10, E85, methanol/);
    expect(byPath["mapOutline.surgeLine"]).toMatch(/^Surge line must have from 2 to 50 points/);
  });
});
