import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  checkCompressorMapOutline,
  checkCompressorPoint,
  checkOperatingPoints,
  compressorOperatingPoints,
  type CompressorMapOutline,
} from "@/lib/calc";
import { expectWithin, expectWorkshopError } from "./helpers";

/**
 * An invented outline (not any maker's map): surge line leaning right as pressure ratio rises,
 * choke points bending back at the top, entered out of order on purpose.
 */
const outline: CompressorMapOutline = {
  flowUnit: "lb/min",
  surgeLine: [
    { correctedFlow: 10, pressureRatio: 2.2 },
    { correctedFlow: 5, pressureRatio: 1.3 },
    { correctedFlow: 14, pressureRatio: 2.8 },
  ],
  chokeLine: [
    { correctedFlow: 18, pressureRatio: 1.3 },
    { correctedFlow: 22, pressureRatio: 2.0 },
    { correctedFlow: 20, pressureRatio: 2.8 },
  ],
};

/** Straight-line reading by hand: flow at pr between (f1, p1) and (f2, p2). */
const along = (f1: number, p1: number, f2: number, p2: number, pr: number) => f1 + ((pr - p1) / (p2 - p1)) * (f2 - f1);

describe("checkCompressorMapOutline", () => {
  it("sorts each line by pressure ratio", () => {
    const m = checkCompressorMapOutline(outline);
    expect(m.surgeLine.map((p) => p.pressureRatio)).toEqual([1.3, 2.2, 2.8]);
    expect(m.reference).toBeNull();
  });
  it("refuses a bad outline in workshop words", () => {
    expectWorkshopError(
      () => checkCompressorMapOutline({ ...outline, surgeLine: [{ correctedFlow: 5, pressureRatio: 1.3 }] }),
      "Surge line",
      /from 2 to 50 points read off the map; got 1 point\./,
      "surgeLine",
    );
    expectWorkshopError(
      () =>
        checkCompressorMapOutline({
          ...outline,
          chokeLine: [
            { correctedFlow: 18, pressureRatio: 1.3 },
            { correctedFlow: 19, pressureRatio: 1.3 },
          ],
        }),
      "Choke line",
      /each pressure ratio once .*; got two points at pressure ratio 1\.3\./,
    );
    expectWorkshopError(
      () =>
        checkCompressorMapOutline({
          ...outline,
          surgeLine: [
            { correctedFlow: 5, pressureRatio: 1.3 },
            { correctedFlow: 25, pressureRatio: 2.5 },
          ],
        }),
      "Surge line",
      /must lie left of the choke line .* at pressure ratio 2\.5 the choke line is at 20\.75 lb\/min; got 25 lb\/min there\. Check the points\./,
    );
    expectWorkshopError(
      () =>
        checkCompressorMapOutline({
          ...outline,
          surgeLine: [
            { correctedFlow: -5, pressureRatio: 1.3 },
            { correctedFlow: 10, pressureRatio: 2 },
          ],
        }),
      "Surge line point 1: corrected air flow",
      /more than 0 and at most 500 lb\/min; got -5 lb\/min\./,
      "surgeLine[0].correctedFlow",
    );
    expectWorkshopError(
      () =>
        checkCompressorMapOutline({
          ...outline,
          chokeLine: [
            { correctedFlow: 18, pressureRatio: 0.9 },
            { correctedFlow: 20, pressureRatio: 2 },
          ],
        }),
      "Choke line point 1: pressure ratio",
      /between 1 and 8/,
    );
    expectWorkshopError(
      () => checkCompressorMapOutline({ ...outline, flowUnit: "cfm" as "kg/s" }),
      "Flow unit of the map",
      /^Flow unit of the map must be one of lb\/min, kg\/s; got "cfm"\.$/,
      "flowUnit",
    );
  });
});

describe("checkCompressorPoint — pure geometry against the user's outline", () => {
  it("left of the surge line → surge warning, with the line's flow read in a straight line", () => {
    const c = checkCompressorPoint(outline, { correctedFlow: 8, pressureRatio: 2.0 });
    expect(c.status).toBe("surge");
    expectWithin(c.surgeFlow!, along(5, 1.3, 10, 2.2, 2.0), 1e-12);
    expect(c.surgeMargin!).toBeLessThan(0);
    expect(c.message).toBe("8 lb/min at pressure ratio 2 is left of the surge line (8.9 lb/min there): surge warning.");
  });
  it("right of the choke line → choke warning", () => {
    const c = checkCompressorPoint(outline, { correctedFlow: 21.5, pressureRatio: 2.5 });
    expect(c.status).toBe("choke");
    expectWithin(c.chokeFlow!, along(22, 2.0, 20, 2.8, 2.5), 1e-12);
    expect(c.chokeMargin!).toBeLessThan(0);
    expect(c.message).toMatch(/right of the choke line \(20\.8 lb\/min there\): choke warning/);
  });
  it("between the lines → inside, with both margins", () => {
    const c = checkCompressorPoint(outline, { correctedFlow: 15, pressureRatio: 2.0 });
    expect(c.status).toBe("inside");
    const surge = along(5, 1.3, 10, 2.2, 2.0);
    expectWithin(c.surgeMargin!, (15 - surge) / surge, 1e-12);
    expectWithin(c.chokeMargin!, (22 - 15) / 22, 1e-12);
    expect(c.message).toBe("15 lb/min at pressure ratio 2 is inside the outline (69 % right of surge, 32 % left of choke).");
  });
  it("exactly on a line counts as on the map side of it", () => {
    expect(checkCompressorPoint(outline, { correctedFlow: 10, pressureRatio: 2.2 }).status).toBe("inside");
    expect(checkCompressorPoint(outline, { correctedFlow: 22, pressureRatio: 2.0 }).status).toBe("inside");
  });
  it("above or below every entered point is said so, not guessed", () => {
    const above = checkCompressorPoint(outline, { correctedFlow: 15, pressureRatio: 3.1 });
    expect(above.status).toBe("above-outline");
    expect(above.surgeFlow).toBeNull();
    expect(above.message).toMatch(/above the highest point entered \(pressure ratio 2\.8\): off the map/);
    const below = checkCompressorPoint(outline, { correctedFlow: 3, pressureRatio: 1.1 });
    expect(below.status).toBe("below-outline");
    expect(below.message).toMatch(/not checked/);
  });
  it("at a fixed pressure ratio, more flow never moves a point from choke back to inside or surge (property)", () => {
    const rank = { surge: 0, inside: 1, choke: 2 } as Record<string, number>;
    fc.assert(
      fc.property(
        fc.double({ min: 1.3, max: 2.8, noNaN: true }),
        fc.double({ min: 0.5, max: 40, noNaN: true }),
        fc.double({ min: 0.01, max: 10, noNaN: true }),
        (pr, flow, more) => {
          const a = checkCompressorPoint(outline, { correctedFlow: flow, pressureRatio: pr }).status;
          const b = checkCompressorPoint(outline, { correctedFlow: flow + more, pressureRatio: pr }).status;
          return rank[b] >= rank[a];
        },
      ),
    );
  });
  it("refuses a bad point in workshop words", () => {
    expectWorkshopError(
      () => checkCompressorPoint(outline, { correctedFlow: 15, pressureRatio: Number.NaN }),
      "Pressure ratio",
      /not a number/,
      "pressureRatio",
    );
    expectWorkshopError(
      () =>
        checkCompressorPoint(
          {
            ...outline,
            flowUnit: "kg/s",
            surgeLine: [
              { correctedFlow: 0.05, pressureRatio: 1.3 },
              { correctedFlow: 0.1, pressureRatio: 2.8 },
            ],
            chokeLine: [
              { correctedFlow: 0.2, pressureRatio: 1.3 },
              { correctedFlow: 0.25, pressureRatio: 2.8 },
            ],
          },
          { correctedFlow: 15, pressureRatio: 2 },
        ),
      "Corrected air flow",
      /at most 4 kg\/s; got 15 kg\/s\./,
    );
  });
});

describe("checkOperatingPoints — the rev range drawn over the outline", () => {
  const ops = compressorOperatingPoints({
    displacementCc: 998,
    rpm: [3500, 8000, 11000],
    volumetricEfficiency: 0.9,
    boostKpa: 69,
    stationPressureKpa: 101.325,
    ambientTempK: 298.15,
    manifoldTempK: 320,
  });
  it("checks each speed in the outline's flow unit and names the speed", () => {
    const checks = checkOperatingPoints(outline, ops);
    expect(checks.map((c) => c.rpm)).toEqual([3500, 8000, 11000]);
    checks.forEach((c, i) => {
      expect(c.correctedFlow).toBe(ops.points[i].correctedFlowLbMin);
      expect(c.status).toBe(checkCompressorPoint(outline, { correctedFlow: c.correctedFlow, pressureRatio: c.pressureRatio }).status);
      expect(c.message.startsWith(`At ${i === 2 ? "11 000" : ops.points[i].rpm} rpm: `)).toBe(true);
    });
    expect(checks.map((c) => c.status)).toEqual(["surge", "inside", "choke"]);
  });
  it("uses kg/s when the outline is drawn in kg/s", () => {
    const kg: CompressorMapOutline = {
      flowUnit: "kg/s",
      surgeLine: outline.surgeLine.map((p) => ({ ...p, correctedFlow: (p.correctedFlow * 0.45359237) / 60 })),
      chokeLine: outline.chokeLine.map((p) => ({ ...p, correctedFlow: (p.correctedFlow * 0.45359237) / 60 })),
    };
    const a = checkOperatingPoints(kg, ops).map((c) => c.status);
    expect(a).toEqual(checkOperatingPoints(outline, ops).map((c) => c.status));
  });
  it("refuses an outline corrected to another reference than the points", () => {
    expectWorkshopError(
      () => checkOperatingPoints({ ...outline, reference: { pressureKpa: 96.18, temperatureK: 302.6 } }, ops),
      "Map reference",
      /must match the reference the operating points are corrected to \(101\.325 kPa, 288\.15 K\); got 96\.18 kPa, 302\.6 K\./,
      "reference",
    );
  });
});
