import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  boostedCompressionRatio,
  boostedDynamicCompressionRatio,
  dynamicCompressionRatio,
  meanPistonSpeedMS,
  pistonPositionFromTdcMm,
  rodRatio,
  squishClearanceMm,
  staticCompressionRatio,
  type DynamicCompressionInput,
} from "@/lib/calc";
import { expectRelClose, expectWithin, expectWorkshopError } from "./helpers";

const KPA_PER_PSI = 6.894757293168; // NIST SP 811 B.8

/** REFERENCE-CHECKS worked example: 76 × 55 mm, rod 110, static 9.5, intake closes 45° ABDC. */
const short: DynamicCompressionInput = {
  boreMm: 76,
  strokeMm: 55,
  rodLengthMm: 110,
  staticCompressionRatio: 9.5,
  intakeClosesDegAbdc: 45,
};

describe("pistonPositionFromTdcMm — Heywood eq. 2.5 slider-crank", () => {
  it("55 mm stroke, 110 mm rod, 225° after TDC → 48.678 mm (REFERENCE-CHECKS, calc)", () => {
    expectWithin(pistonPositionFromTdcMm({ strokeMm: 55, rodLengthMm: 110, crankAngleDeg: 225 }), 48.678, 0.0005);
  });
  it("is 0 at TDC, the full stroke at BDC, and past half stroke at 90° (rod angularity)", () => {
    expectWithin(pistonPositionFromTdcMm({ strokeMm: 55, rodLengthMm: 110, crankAngleDeg: 0 }), 0, 1e-12);
    expectWithin(pistonPositionFromTdcMm({ strokeMm: 55, rodLengthMm: 110, crankAngleDeg: 180 }), 55, 1e-12);
    // by the triangle at 90°: pin height √(l² − a²), so distance = l + a − √(l² − a²)
    expectWithin(
      pistonPositionFromTdcMm({ strokeMm: 55, rodLengthMm: 110, crankAngleDeg: 90 }),
      110 + 27.5 - Math.sqrt(110 ** 2 - 27.5 ** 2),
      1e-12,
    );
    expect(pistonPositionFromTdcMm({ strokeMm: 55, rodLengthMm: 110, crankAngleDeg: 90 })).toBeGreaterThan(27.5);
  });
  it("matches the crank-pin and rod triangle drawn with coordinates (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 20, max: 120, noNaN: true }),
        fc.double({ min: 1, max: 2.5, noNaN: true }),
        fc.double({ min: 0, max: 360, noNaN: true }),
        (stroke, ratio, deg) => {
          const a = stroke / 2;
          const l = stroke * ratio;
          const th = (deg * Math.PI) / 180;
          // crank pin at (a·sin θ, a·cos θ); gudgeon pin on the bore axis at height y with |pin − crank pin| = l
          const y = a * Math.cos(th) + Math.sqrt(l * l - (a * Math.sin(th)) ** 2);
          const x = pistonPositionFromTdcMm({ strokeMm: stroke, rodLengthMm: l, crankAngleDeg: deg });
          return Math.abs(x - (a + l - y)) < 1e-9 && x >= -1e-9 && x <= stroke + 1e-9;
        },
      ),
    );
  });
});

describe("dynamicCompressionRatio — (Vc + A·x(180° + IVC)) / Vc", () => {
  it("76 × 55, rod 110, 9.5:1, intake closes 45° ABDC → 8.5229 (REFERENCE-CHECKS, calc)", () => {
    expectWithin(dynamicCompressionRatio(short), 8.5229, 0.00005);
  });
  it("equals the static ratio when the intake closes at BDC; closing 30° before BDC equals 30° after (slider-crank symmetry)", () => {
    expectRelClose(dynamicCompressionRatio({ ...short, intakeClosesDegAbdc: 0 }), 9.5, 1e-12);
    expectRelClose(
      dynamicCompressionRatio({ ...short, intakeClosesDegAbdc: -30 }),
      dynamicCompressionRatio({ ...short, intakeClosesDegAbdc: 30 }),
      1e-12,
    );
  });
  it("agrees with the static-CR sheet: a chamber giving 9.5:1 there gives the same DCR here (Heywood ch. 2)", () => {
    // 76 × 55 mm: swept 249.5 cc; a chamber of swept/8.5 with no gasket, deck or dish is 9.5:1
    const swept = (Math.PI / 4) * 7.6 ** 2 * 5.5;
    const cr = staticCompressionRatio({
      boreMm: 76,
      strokeMm: 55,
      chamberCc: swept / 8.5,
      gasketBoreMm: 77,
      gasketThicknessMm: 0,
      deckClearanceMm: 0,
      pistonDishCc: 0,
    });
    expectRelClose(cr, 9.5, 1e-12);
    expectRelClose(dynamicCompressionRatio({ ...short, staticCompressionRatio: cr }), dynamicCompressionRatio(short), 1e-12);
  });
  it("DCR < static CR whenever the intake closes after BDC, and later closing lowers it (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 40, max: 110, noNaN: true }),
        fc.double({ min: 30, max: 110, noNaN: true }),
        fc.double({ min: 1.3, max: 2.3, noNaN: true }),
        fc.double({ min: 7, max: 15, noNaN: true }),
        fc.double({ min: 1, max: 100, noNaN: true }),
        (bore, stroke, ratio, cr, ivc) => {
          const input = {
            boreMm: bore,
            strokeMm: stroke,
            rodLengthMm: stroke * ratio,
            staticCompressionRatio: cr,
            intakeClosesDegAbdc: ivc,
          };
          const dcr = dynamicCompressionRatio(input);
          return dcr < cr && dcr > 1 && dynamicCompressionRatio({ ...input, intakeClosesDegAbdc: ivc + 5 }) < dcr;
        },
      ),
    );
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(
      () => dynamicCompressionRatio({ ...short, rodLengthMm: 40 }),
      "Rod length (centre to centre)",
      /must be at least the stroke \(55 mm\); got 40 mm\./,
      "rodLengthMm",
    );
    expectWorkshopError(
      () => dynamicCompressionRatio({ ...short, staticCompressionRatio: 1 }),
      "Static compression ratio",
      /between 2 and 25 \(9\.5 means 9\.5:1\); got 1\./,
    );
    expectWorkshopError(
      () => dynamicCompressionRatio({ ...short, intakeClosesDegAbdc: 245 }),
      "Intake valve closing",
      /between -90 and 150° \(crank degrees after bottom dead centre; .*\); got 245°\./,
    );
    expectWorkshopError(() => dynamicCompressionRatio({ ...short, boreMm: 0.076 }), "Bore", /between 20 and 200 mm; got 0\.076 mm\./);
    expectWorkshopError(() => dynamicCompressionRatio({ ...short, strokeMm: Number.NaN }), "Stroke", /not a number/);
  });
});

describe("boostedDynamicCompressionRatio — DCR × (station + boost) / station, common practice", () => {
  it("8.5229 at 10 psi at sea level → 8.5229 × 1.6805 (the CR·(1 + psi/14.7) rule, common practice)", () => {
    const r = boostedDynamicCompressionRatio({ ...short, boostKpa: 10 * KPA_PER_PSI });
    expectWithin(r.dynamicRatio, 8.5229, 0.00005);
    expectRelClose(r.boostedRatio, r.dynamicRatio * ((101.325 + 10 * KPA_PER_PSI) / 101.325), 1e-12);
    expectRelClose(r.boostedRatio, boostedCompressionRatio(r.dynamicRatio, 10 * KPA_PER_PSI), 1e-15);
  });
  it("trade check (common practice): stock ~12:1 lowered to ~9.5:1 for ~10 psi sits below stock 12:1 on a ~7 psi kit", () => {
    const lowered = boostedDynamicCompressionRatio({ ...short, staticCompressionRatio: 9.5, boostKpa: 10 * KPA_PER_PSI }).boostedRatio;
    const stockOnKit = boostedDynamicCompressionRatio({ ...short, staticCompressionRatio: 12, boostKpa: 7 * KPA_PER_PSI }).boostedRatio;
    expect(lowered).toBeLessThan(stockOnKit);
  });
  it("thinner air at altitude makes the same gauge boost count for more", () => {
    const sea = boostedDynamicCompressionRatio({ ...short, boostKpa: 69 }).boostedRatio;
    const high = boostedDynamicCompressionRatio({ ...short, boostKpa: 69, stationPressureKpa: 89.875 }).boostedRatio;
    expect(high).toBeGreaterThan(sea);
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(
      () => boostedDynamicCompressionRatio({ ...short, boostKpa: 1000 }),
      "Boost (gauge, above the air pressure)",
      /got 1000 kPa/,
    );
    expectWorkshopError(
      () => boostedDynamicCompressionRatio({ ...short, boostKpa: 69, stationPressureKpa: 14.7 }),
      "Air pressure at the engine (station pressure)",
      /got 14\.7 kPa/,
    );
  });
});

describe("meanPistonSpeedMS — Heywood ch. 2: 2·L·N/60", () => {
  it("55 mm at 12 000 rpm → 22.0 m/s (REFERENCE-CHECKS, calc)", () => {
    expectWithin(meanPistonSpeedMS(55, 12000), 22, 1e-12);
  });
  it("3.0 in stroke at 6 000 rpm → 3 000 ft/min (the trade's stroke_in × rpm / 6 in ft/min, common practice)", () => {
    expectWithin(meanPistonSpeedMS(3 * 25.4, 6000), (3000 * 0.3048) / 60, 1e-12);
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(
      () => meanPistonSpeedMS(55, -5),
      "Engine speed",
      /^Engine speed must be between 1 and 25 000 rpm; got -5 rpm\.$/,
      "rpm",
    );
    expectWorkshopError(() => meanPistonSpeedMS(5500, 6000), "Stroke", /between 10 and 250 mm; got 5500 mm\./);
  });
});

describe("rodRatio — rod length / stroke (trade form; Heywood's R = l/a is twice this)", () => {
  it("110 mm rod on a 55 mm stroke → 2.0", () => {
    expect(rodRatio(110, 55)).toBe(2);
  });
  it("refuses a rod shorter than the stroke", () => {
    expectWorkshopError(() => rodRatio(50, 55), "Rod length (centre to centre)", /at least the stroke/);
  });
});

describe("squishClearanceMm — compressed gasket + piston-to-deck (negative when the piston stands proud)", () => {
  it("1.0 mm gasket, crown 0.2 mm below the deck → 1.2 mm", () => {
    expectWithin(squishClearanceMm({ compressedGasketMm: 1.0, deckClearanceMm: 0.2 }), 1.2, 1e-12);
  });
  it("1.0 mm gasket, crown 0.3 mm proud → 0.7 mm", () => {
    expectWithin(squishClearanceMm({ compressedGasketMm: 1.0, deckClearanceMm: -0.3 }), 0.7, 1e-12);
  });
  it("0.040 in gasket, 0.005 in below deck → 0.045 in (the trade's quench sum, common practice)", () => {
    expectWithin(squishClearanceMm({ compressedGasketMm: 0.04 * 25.4, deckClearanceMm: 0.005 * 25.4 }) / 25.4, 0.045, 1e-12);
  });
  it("refuses a piston that would hit the head, in workshop words", () => {
    expectWorkshopError(
      () => squishClearanceMm({ compressedGasketMm: 1.0, deckClearanceMm: -1.2 }),
      "Squish clearance",
      /^Squish clearance must be more than 0 mm: the piston would hit the head \(gasket 1 mm, piston to deck -1\.2 mm\); got -0\.2 mm\.$/,
    );
    expectWorkshopError(
      () => squishClearanceMm({ compressedGasketMm: -1, deckClearanceMm: 0 }),
      "Compressed head gasket thickness",
      /got -1 mm/,
    );
  });
});
