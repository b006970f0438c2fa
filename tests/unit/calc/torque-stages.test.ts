import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { TORQUE_UNITS, torqueStages, type TorqueSpec, type TorqueUnit } from "@/lib/calc";
import { expectCalcError } from "./helpers";

describe("torqueStages", () => {
  it("expands percentage, absolute and angle passes in order, with labels", () => {
    const passes = torqueStages({
      finalValue: 40,
      unit: "N·m",
      passes: [{ percent: 30 }, { value: 25 }, { percent: 100 }],
      anglePasses: [90, 90],
    });
    expect(passes).toEqual([
      { index: 1, kind: "torque", target: 12, unit: "N·m", percentOfFinal: 30, label: "30 %" },
      { index: 2, kind: "torque", target: 25, unit: "N·m", percentOfFinal: 62.5, label: "25 N·m" },
      { index: 3, kind: "torque", target: 40, unit: "N·m", percentOfFinal: 100, label: "100 %" },
      { index: 4, kind: "angle", target: 90, unit: "°", label: "+90°" },
      { index: 5, kind: "angle", target: 90, unit: "°", label: "+90°" },
    ]);
  });

  it("takes a flange sequence of 20 %, 60 %, 100 % plus a check pass at 100 % (ASME PCC-1 passes, from memory)", () => {
    // PCC-1 legacy passes (from memory): snug ≤ 20 %, 20–30 %, 50–70 %, 100 %, then circular passes at 100 %
    const passes = torqueStages({
      finalValue: 60,
      unit: "lbf·ft",
      passes: [{ percent: 20 }, { percent: 60 }, { percent: 100 }, { percent: 100 }],
    });
    expect(passes.map((p) => p.target)).toEqual([12, 36, 60, 60]);
    expect(passes.every((p) => p.kind === "torque" && p.unit === "lbf·ft")).toBe(true);
  });

  it("an empty pass list means one pass at the final value", () => {
    expect(torqueStages({ finalValue: 10, unit: "N·m", passes: [] })).toEqual([
      { index: 1, kind: "torque", target: 10, unit: "N·m", percentOfFinal: 100, label: "100 %" },
    ]);
  });

  const validSpec = fc
    .record({
      finalValue: fc.double({ min: 1, max: 500, noNaN: true }),
      unit: fc.constantFrom(...TORQUE_UNITS),
      percents: fc.array(fc.integer({ min: 1, max: 100 }), { maxLength: 6 }),
      angles: fc.array(fc.integer({ min: 1, max: 360 }), { maxLength: 3 }),
    })
    .map(({ finalValue, unit, percents, angles }) => ({
      finalValue,
      unit: unit as TorqueUnit,
      passes: [...[...percents].sort((a, b) => a - b), 100].map((percent) => ({ percent })),
      anglePasses: angles,
    }));

  it("torque targets never decrease, end at the final value, and angle passes come last (property)", () => {
    fc.assert(
      fc.property(validSpec, (spec: TorqueSpec) => {
        const out = torqueStages(spec);
        const torque = out.filter((p) => p.kind === "torque");
        const firstAngle = out.findIndex((p) => p.kind === "angle");
        return (
          out.every((p, i) => p.index === i + 1) &&
          torque.every((p, i) => i === 0 || p.target >= torque[i - 1].target) &&
          torque[torque.length - 1].target === spec.finalValue &&
          (firstAngle === -1 || out.slice(firstAngle).every((p) => p.kind === "angle")) &&
          out.length === spec.passes.length + (spec.anglePasses?.length ?? 0)
        );
      }),
    );
  });

  it("throws CalcInputError for impossible specs", () => {
    const base: TorqueSpec = { finalValue: 40, unit: "N·m", passes: [{ percent: 50 }, { percent: 100 }] };
    expectCalcError(() => torqueStages({ ...base, finalValue: 0 }), "spec.finalValue", /> 0/);
    expectCalcError(() => torqueStages({ ...base, unit: "Nm" as TorqueUnit }), "spec.unit", /"Nm"/);
    expectCalcError(() => torqueStages({ ...base, passes: [{ percent: 0 }, { percent: 100 }] }), "spec.passes[0].percent", /\(0, 100\]/);
    expectCalcError(() => torqueStages({ ...base, passes: [{ percent: 110 }] }), "spec.passes[0].percent");
    expectCalcError(() => torqueStages({ ...base, passes: [{ value: 50 }] }), "spec.passes[0].value", /\(0, 40\]/);
    expectCalcError(
      () => torqueStages({ ...base, passes: [{ percent: 70 }, { percent: 50 }, { percent: 100 }] }),
      "spec.passes[1]",
      /must not be below the previous pass/,
    );
    expectCalcError(() => torqueStages({ ...base, passes: [{ percent: 30 }, { percent: 70 }] }), "spec.passes", /final value/);
    expectCalcError(
      () => torqueStages({ ...base, passes: [{ percent: 50, value: 20 } as unknown as { percent: number }, { percent: 100 }] }),
      "spec.passes[0]",
      /exactly one/,
    );
    expectCalcError(() => torqueStages({ ...base, anglePasses: [90, 0] }), "spec.anglePasses[1]", /\(0, 360\]/);
    expectCalcError(() => torqueStages({ ...base, anglePasses: [400] }), "spec.anglePasses[0]");
    expectCalcError(() => torqueStages({ ...base, passes: "all" as unknown as TorqueSpec["passes"] }), "spec.passes", /array/);
    expectCalcError(() => torqueStages(undefined as unknown as TorqueSpec), "spec");
  });
});
