import { describe, expect, it } from "vitest";
import { readTemplateFile } from "@/lib/procedures/template-file";
import { DEMO_TEMPLATES } from "@/lib/procedures/demo-templates";
import { MAX_READING, WRENCH_READING_LIMIT } from "@/lib/sync/operations";

// A template's figures stay within what the bench takes as a reading: a torque no fastener on an
// engine comes near (the wrench limit of its unit) or a length past a metre in µm is a slip of the
// finger, refused with its place in the file, not stored and shown on every tablet as "1e+300".

const step = (extra: Record<string, unknown>) => ({
  format: "benchtag-template",
  formatVersion: 1,
  key: "limits",
  name: "Limits",
  stages: [{ key: "s", title: "Stage", steps: [{ key: "a", title: "Step", ...extra }] }],
});
const torque = (finalValue: number, unit: string, passes: unknown[] = []) => ({
  label: "Head bolts",
  finalValue,
  unit,
  passes,
  pattern: "cross",
  boltCount: 4,
});

describe("a template's figures", () => {
  it("refuses a torque beyond any fastener on an engine, in the unit given, for the final value and each pass", () => {
    const r = readTemplateFile(JSON.stringify(step({ torque: [torque(2500, "N·m", [{ percent: 50 }, { value: 2100 }])] })));
    expect(r).toEqual({
      ok: false,
      issues: [
        {
          path: "stages[0].steps[0].torque[0].finalValue",
          message: "Final value: 2500 N·m is beyond any fastener on an engine (the most is 2000 N·m).",
        },
        {
          path: "stages[0].steps[0].torque[0].passes[1].value",
          message: "Pass 2: 2100 N·m is beyond any fastener on an engine (the most is 2000 N·m).",
        },
      ],
    });
    // the limit is the unit's: 2500 lbf·in is about 282 N·m
    expect(readTemplateFile(JSON.stringify(step({ torque: [torque(2500, "lbf·in")] }))).ok).toBe(true);
    expect(WRENCH_READING_LIMIT["lbf·in"]).toBeGreaterThan(2500);
  });

  it("refuses a measurement's figures past a metre in µm, either way", () => {
    const spec = { key: "bore", label: "Bore", min: -1e300, max: 1e300, nominal: 0, unit: "mm" };
    const r = readTemplateFile(JSON.stringify(step({ measurements: [spec] })));
    expect(r.ok).toBe(false);
    const paths = r.ok ? [] : r.issues.map((i) => i.path);
    expect(paths).toEqual(["stages[0].steps[0].measurements[0].min", "stages[0].steps[0].measurements[0].max"]);
    expect(r.ok ? "" : r.issues[1].message).toBe(`Maximum: must be at most ${MAX_READING}`);
  });

  it("keeps every demo template valid", () => {
    for (const t of DEMO_TEMPLATES) expect(readTemplateFile(JSON.stringify(t)).ok, t.key).toBe(true);
  });
});
