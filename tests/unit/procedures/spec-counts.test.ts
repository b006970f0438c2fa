import { describe, expect, it } from "vitest";
import { torqueStages } from "@/lib/calc/torque-stages";
import { DEMO_TEMPLATES } from "@/lib/procedures/demo-templates";
import { expectedReadings, torquePassCount } from "@/lib/procedures/spec-counts";
import { torqueSpecSchema } from "@/lib/procedures/template-schema";

// The counts the server checks a reading index or a torque pass against are the ones the tablet
// lays out: one function each (the tablet walks torqueStages; the server counts it).
describe("how much work a spec asks for", () => {
  it("expects one reading per label, and one when there are no labels", () => {
    expect(expectedReadings([])).toBe(1);
    expect(expectedReadings(["Cyl 1", "Cyl 2", "Cyl 3", "Cyl 4"])).toBe(4);
  });

  it("counts torque passes as the tablet walks them: one pass at the final value when none are listed, then the angle passes", () => {
    expect(torquePassCount({ finalValue: 45, unit: "N·m", passes: [], anglePasses: [] })).toBe(1);
    expect(torquePassCount({ finalValue: 45, unit: "N·m", passes: [], anglePasses: [90, 90] })).toBe(3);
    expect(
      torquePassCount({ finalValue: 45, unit: "N·m", passes: [{ percent: 30 }, { percent: 60 }, { percent: 100 }], anglePasses: [90] }),
    ).toBe(4);
  });

  it("agrees with the tablet's pass list for every torque spec of the demo templates", () => {
    const specs = DEMO_TEMPLATES.flatMap((t) =>
      t.stages.flatMap((s) => s.steps.flatMap((st) => (st.torque ?? []).map((spec) => torqueSpecSchema.parse(spec)))),
    );
    expect(specs.length).toBeGreaterThan(0);
    for (const t of specs) expect(torquePassCount(t)).toBe(torqueStages(t).length);
  });
});
