import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { compressorOperatingPoints, type OperatingPointsInput } from "@/lib/calc";
import { expectRelClose, expectWithin, expectWorkshopError } from "./helpers";

const R = 287.05287; // ISO 2533 specific gas constant of dry air
const KPA_PER_PSI = 6.894757293168; // NIST SP 811 B.8

/** A 998 cc four on a bolt-on kit at about 7 psi (common practice for such kits). */
const kit: OperatingPointsInput = {
  displacementCc: 998,
  rpm: [4000, 7000, 11000],
  volumetricEfficiency: [
    { rpm: 4000, value: 0.8 },
    { rpm: 11000, value: 0.95 },
  ],
  boostKpa: 7 * KPA_PER_PSI,
  stationPressureKpa: 101.325,
  ambientTempK: 298.15,
  filterLossKpa: 1,
  intercoolerDropKpa: 5,
  pipingDropKpa: 2,
  compressorEfficiency: 0.72,
  intercoolerEffectiveness: 0.75,
};

/** Every step written out from its formula, independently of lib/calc. */
function byHand(rpm: number, ve: number, boost: number) {
  const inlet = 101.325 - 1;
  const manifold = 101.325 + boost;
  const pr = (manifold + 5 + 2) / inlet;
  const t2 = 298.15 * (1 + (Math.pow(pr, 0.4 / 1.4) - 1) / 0.72); // NASA Glenn compressor thermodynamics
  const tMan = t2 - 0.75 * (t2 - 298.15); // intercooler effectiveness
  const m = (ve * ((manifold * 1000) / (R * tMan)) * 998e-6 * rpm) / 2 / 60; // Heywood ch. 2
  const corrected = (m * Math.sqrt(298.15 / 288.15)) / (inlet / 101.325);
  return { pr, t2, tMan, m, corrected };
}

describe("compressorOperatingPoints — the compressor's points across the rev range", () => {
  it("works each speed out as the formulas do by hand (Heywood ch. 2, NASA Glenn, corrected flow)", () => {
    const { points, reference } = compressorOperatingPoints(kit);
    expect(reference).toEqual({ pressureKpa: 101.325, temperatureK: 288.15 });
    expect(points.map((p) => p.rpm)).toEqual([4000, 7000, 11000]);
    const ve7000 = 0.8 + ((7000 - 4000) / (11000 - 4000)) * (0.95 - 0.8); // straight line between curve points
    const expected = [byHand(4000, 0.8, 7 * KPA_PER_PSI), byHand(7000, ve7000, 7 * KPA_PER_PSI), byHand(11000, 0.95, 7 * KPA_PER_PSI)];
    points.forEach((p, i) => {
      expectRelClose(p.volumetricEfficiency, [0.8, ve7000, 0.95][i], 1e-12);
      expectRelClose(p.pressureRatio, expected[i].pr, 1e-12);
      expectRelClose(p.compressorOutletTempK!, expected[i].t2, 1e-12);
      expectRelClose(p.manifoldTempK, expected[i].tMan, 1e-12);
      expectRelClose(p.airMassFlowKgS, expected[i].m, 1e-12);
      expectRelClose(p.correctedFlowKgS, expected[i].corrected, 1e-12);
      expectRelClose(p.correctedFlowLbMin, (expected[i].corrected * 60) / 0.45359237, 1e-12);
    });
  });
  it("7 psi through 8 kPa of losses needs PR ≈ 1.561 and the litre four draws ≈ 19.71 lb/min corrected at 11 000 rpm (calc)", () => {
    const top = compressorOperatingPoints(kit).points[2];
    expectWithin(top.pressureRatio, (101.325 + 7 * KPA_PER_PSI + 7) / 100.325, 1e-12);
    expectWithin(top.pressureRatio, 1.5608, 0.0001);
    expectWithin(top.correctedFlowLbMin, 19.71, 0.005);
  });
  it("takes a given manifold temperature as it is (no compressor temperature worked out)", () => {
    const { points } = compressorOperatingPoints({
      ...kit,
      manifoldTempK: 320,
      compressorEfficiency: undefined,
      intercoolerEffectiveness: undefined,
    });
    for (const p of points) {
      expect(p.manifoldTempK).toBe(320);
      expect(p.compressorOutletTempK).toBeNull();
    }
  });
  it("reads a boost curve that rises as the turbo spools", () => {
    const { points } = compressorOperatingPoints({
      ...kit,
      boostKpa: [
        { rpm: 3000, value: 0 },
        { rpm: 6000, value: 48 },
        { rpm: 12000, value: 48 },
      ],
    });
    expectWithin(points[0].boostKpa, 16, 1e-12); // 4000 rpm: a third of the way from 0 to 48
    expect(points[1].boostKpa).toBe(48);
    expect(points[2].boostKpa).toBe(48);
  });
  it("more rpm at the same VE and boost means more corrected flow (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1000, max: 12000, noNaN: true }),
        fc.double({ min: 10, max: 3000, noNaN: true }),
        fc.double({ min: 0, max: 200, noNaN: true }),
        (rpm, more, boost) => {
          const { points } = compressorOperatingPoints({ ...kit, rpm: [rpm, rpm + more], volumetricEfficiency: 0.9, boostKpa: boost });
          return points[1].correctedFlowKgS > points[0].correctedFlowKgS && points[1].pressureRatio === points[0].pressureRatio;
        },
      ),
    );
  });
  it("refuses impossible input in workshop words", () => {
    expectWorkshopError(
      () => compressorOperatingPoints({ ...kit, rpm: [] }),
      "The rev range",
      /from 1 to 200 engine speeds; got 0 engine speeds\./,
      "rpm",
    );
    expectWorkshopError(() => compressorOperatingPoints({ ...kit, rpm: [4000, -1] }), "Engine speed", /got -1 rpm/, "rpm[1]");
    expectWorkshopError(
      () => compressorOperatingPoints({ ...kit, rpm: [12000] }),
      "Engine speed",
      /must lie within the volumetric efficiency curve \(4000 to 11 000 rpm\); add a point there; got 12 000 rpm\./,
      "volumetricEfficiency",
    );
    expectWorkshopError(
      () =>
        compressorOperatingPoints({
          ...kit,
          volumetricEfficiency: [
            { rpm: 4000, value: 0.8 },
            { rpm: 4000, value: 0.9 },
          ],
        }),
      "Volumetric efficiency curve",
      /must give each engine speed once; got 4000 rpm twice\./,
    );
    expectWorkshopError(
      () =>
        compressorOperatingPoints({
          ...kit,
          volumetricEfficiency: [
            { rpm: 4000, value: 80 },
            { rpm: 11000, value: 0.9 },
          ],
        }),
      "Volumetric efficiency at 4000 rpm",
      /0\.9 means 90 %\); got 80\./,
      "volumetricEfficiency[0].value",
    );
    expectWorkshopError(
      () => compressorOperatingPoints({ ...kit, compressorEfficiency: undefined }),
      "Compressor efficiency",
      /is needed to work out the manifold air temperature/,
    );
    expectWorkshopError(
      () => compressorOperatingPoints({ ...kit, intercoolerEffectiveness: undefined }),
      "Intercooler effectiveness",
      /use 0 without an intercooler/,
    );
    expectWorkshopError(() => compressorOperatingPoints({ ...kit, compressorEfficiency: 72 }), "Compressor efficiency", /0\.72 means 72 %/);
    expectWorkshopError(
      () => compressorOperatingPoints({ ...kit, ambientTempK: 25 }),
      "Ambient air temperature",
      /got 25 K \(-248\.15 °C\)/,
    );
  });
});
