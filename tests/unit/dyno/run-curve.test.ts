import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { convertPower, convertTorque } from "@/lib/calc";
import { computeRunCurve, peakOf } from "@/lib/dyno";
import { expectWithin } from "../calc/helpers";

const KPA_PER_INHG = 3.386389; // NIST SP 811 B.8: inch of mercury, conventional = 3.386 389 E+03 Pa
const fToC = (f: number) => (f - 32) / 1.8; // NIST SP 811 B.8
const dry = (pressureKpa: number, temperatureC: number) => ({ pressureKpa, temperatureC, humidityPercent: 0 });

describe("observed power from torque and engine speed", () => {
  it("400 N·m at 6000 rpm → 251.33 kW (REFERENCE-CHECKS: kW = N·m · rpm / 9549.297, calc)", () => {
    const c = computeRunCurve(
      [
        { rpm: 5000, torqueNm: 300 },
        { rpm: 6000, torqueNm: 400 },
      ],
      { ...dry(99, 25), standard: "ISO_1585" },
    );
    expectWithin(c.points[1].observedPowerKw, 251.33, 0.005);
  });
  it("300 lbf·ft at 5000 rpm → 285.60 hp (trade relation hp = lbf·ft · rpm / 5252.113, REFERENCE-CHECKS page)", () => {
    const c = computeRunCurve(
      [
        { rpm: 4000, torqueNm: convertTorque(250, "lbf·ft", "N·m") },
        { rpm: 5000, torqueNm: convertTorque(300, "lbf·ft", "N·m") },
      ],
      { ...dry(99, 25), standard: "ISO_1585" },
    );
    expectWithin(convertPower(c.points[1].observedPowerKw, "kW", "hp"), 285.6, 0.005);
  });
});

describe("corrected values use the chosen standard's factor", () => {
  const curve = [
    { rpm: 6000, torqueNm: 100 },
    { rpm: 8000, torqueNm: 90 },
    { rpm: 10000, torqueNm: 70 },
  ];
  it("SAE J1349 (1990 form), 1000 mbar dry, 30 °C → factor 0.99796 (REFERENCE-CHECKS, calc from the published formula)", () => {
    const c = computeRunCurve(curve, { ...dry(100, 30), standard: "SAE_J1349" });
    expectWithin(c.factor, 0.99796, 0.000005);
    expectWithin(c.points[0].correctedTorqueNm, 100 * 0.99796, 0.0005);
  });
  it("DIN 70020, 1000 mbar, 30 °C → 1.03014 and ignores humidity (REFERENCE-CHECKS, calc from the published formula)", () => {
    const c = computeRunCurve(curve, { pressureKpa: 100, temperatureC: 30, humidityPercent: 60, standard: "DIN_70020" });
    expectWithin(c.factor, 1.03014, 0.000005);
  });
  it("ISO 1585, 95 kPa dry, 35 °C → 1.07175 (REFERENCE-CHECKS, calc with T = t + 273)", () => {
    const c = computeRunCurve(curve, { ...dry(95, 35), standard: "ISO_1585" });
    expectWithin(c.factor, 1.07175, 0.000005);
    expectWithin(c.points[1].correctedPowerKw, c.points[1].observedPowerKw * 1.07175, 0.0005);
  });
  it("SAE J607 with humidity: 28.85 inHg, 85 °F, 85 % RH → 1.1005 ± 0.001 (published example, REFERENCE-CHECKS page)", () => {
    const c = computeRunCurve(curve, {
      pressureKpa: 28.85 * KPA_PER_INHG,
      temperatureC: fToC(85),
      humidityPercent: 85,
      standard: "SAE_J607",
    });
    expectWithin(c.factor, 1.1005, 0.001);
    expect(c.vaporPressureKpa).toBeGreaterThan(0);
  });
});

describe("peaks", () => {
  it("worked example: 100/90/70 N·m at 6000/8000/10000 rpm → peak power 75.40 kW at 8000, peak torque 100 N·m at 6000 (arithmetic from P = T·n·2π/60 000)", () => {
    const c = computeRunCurve(
      [
        { rpm: 6000, torqueNm: 100 },
        { rpm: 8000, torqueNm: 90 },
        { rpm: 10000, torqueNm: 70 },
      ],
      { ...dry(99, 25), standard: "ISO_1585" }, // ISO 1585 reference conditions: factor exactly 1
    );
    expect(c.peaks.observedPowerKw.rpm).toBe(8000);
    expectWithin(c.peaks.observedPowerKw.value, 75.398, 0.0005);
    expect(c.peaks.observedTorqueNm).toEqual({ value: 100, rpm: 6000 });
    expectWithin(c.peaks.correctedPowerKw.value, 75.398, 0.0005);
  });
  it("a tie keeps the lower rpm (our rule)", () => {
    expect(
      peakOf(
        [
          { rpm: 1, v: 5 },
          { rpm: 2, v: 5 },
        ],
        (p) => p.v,
      ),
    ).toEqual({ value: 5, rpm: 1 });
  });
});

describe("bad curves are refused with the point named", () => {
  it("falling rpm", () => {
    expect(() =>
      computeRunCurve(
        [
          { rpm: 5000, torqueNm: 1 },
          { rpm: 4000, torqueNm: 1 },
        ],
        { ...dry(99, 25), standard: "SAE_J1349" },
      ),
    ).toThrow(/points\[1\]\.rpm must be above/);
  });
  it("one point only", () => {
    expect(() => computeRunCurve([{ rpm: 5000, torqueNm: 1 }], { ...dry(99, 25), standard: "SAE_J1349" })).toThrow(/at least two/);
  });
});

describe("properties", () => {
  it("corrected / observed equals the factor at every point, and power = torque · rpm · 2π / 60 000", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 1, max: 300, noNaN: true }), { minLength: 2, maxLength: 30 }),
        fc.double({ min: 85, max: 105, noNaN: true }),
        fc.double({ min: 0, max: 45, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        (torques, p, t, rh) => {
          const c = computeRunCurve(
            torques.map((torqueNm, i) => ({ rpm: 2000 + i * 250, torqueNm })),
            { pressureKpa: p, temperatureC: t, humidityPercent: rh, standard: "SAE_J1349" },
          );
          for (const pt of c.points) {
            expect(Math.abs(pt.correctedTorqueNm / pt.observedTorqueNm - c.factor)).toBeLessThan(1e-12);
            expect(Math.abs(pt.observedPowerKw - (pt.observedTorqueNm * pt.rpm * 2 * Math.PI) / 60000)).toBeLessThan(1e-9);
          }
        },
      ),
    );
  });
});
