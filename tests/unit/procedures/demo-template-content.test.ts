import { describe, expect, it } from "vitest";
import { DEMO_TEMPLATES } from "@/lib/procedures/demo-templates";
import { cylinderHeadTemplate } from "@/lib/procedures/demo-templates/cylinder-head";
import { firstStartTemplate } from "@/lib/procedures/demo-templates/first-start";
import { turboKitTemplate } from "@/lib/procedures/demo-templates/turbo-kit";
import { templateDocumentSchema, type TemplateDocument } from "@/lib/procedures/template-schema";

// The demo templates are example content, but they must not contradict each other or leave out the
// checks a boosted build needs. These tests read the templates as a workshop would.

const parsed = (t: unknown): TemplateDocument => templateDocumentSchema.parse(t);
const stepsOf = (t: unknown) => parsed(t).stages.flatMap((s) => s.steps);
const cautionText = (t: unknown) =>
  stepsOf(t)
    .flatMap((s) => s.cautions.map((c) => c.text))
    .join("\n");

/** "Head bolts M10" and "Head bolts, cold retorque" name the same fastener: "head bolts". */
const fastener = (label: string) =>
  label
    .toLowerCase()
    .replace(/[,(].*$/, "")
    .replace(/\bm\d+\b/g, "")
    .trim();

describe("demo templates agree with each other", () => {
  it("no template tightens again a fastener another template fits as torque-to-yield", () => {
    const stretch = new Set(
      DEMO_TEMPLATES.flatMap((t) =>
        stepsOf(t)
          .flatMap((s) => s.torque)
          .filter((q) => q.torqueToYield)
          .map((q) => fastener(q.label)),
      ),
    );
    expect(stretch.has("head bolts")).toBe(true); // the head job fits stretch bolts
    const again = DEMO_TEMPLATES.flatMap((t) =>
      stepsOf(t)
        .flatMap((s) => s.torque)
        .filter((q) => !q.torqueToYield && stretch.has(fastener(q.label)))
        .map((q) => `${parsed(t).key}: ${q.label}`),
    );
    expect(again).toEqual([]);
  });

  it("the first start says the head is not retorqued and rechecks the exhaust cold instead", () => {
    const step = stepsOf(firstStartTemplate).find((s) => s.key === "recheck-after-heat")!;
    expect(step.title).toMatch(/not retorqued/);
    expect(step.cautions.map((c) => c.kind)).toContain("torque-to-yield");
    expect(step.torque.map((q) => fastener(q.label))).toEqual(["exhaust header nuts"]);
  });
});

describe("cautions where work can hurt", () => {
  it("the dyno check names tie-downs, the fan, extraction, hearing and the line of the wheel", () => {
    const stage = parsed(firstStartTemplate).stages.find((s) => s.key === "dyno-check")!;
    const text = stage.steps
      .flatMap((s) => s.cautions.map((c) => c.text))
      .join("\n")
      .toLowerCase();
    for (const hazard of [/tie-down|strap/, /fan/, /extraction/, /hearing/, /in line with the rear wheel/]) expect(text).toMatch(hazard);
  });

  it("the turbo kit checks what a boosted build needs before any boost", () => {
    const keys = stepsOf(turboKitTemplate).map((s) => s.key);
    const order = ["blow-off-valve", "fuel-pressure-reference", "map-sensor-range", "crankcase-breathing", "sign-off-fitting"];
    expect(order.map((k) => keys.indexOf(k))).toEqual([...order.map((k) => keys.indexOf(k))].sort((a, b) => a - b));
    expect(order.every((k) => keys.includes(k))).toBe(true);
    const text = cautionText(turboKitTemplate);
    expect(text).toMatch(/surge/);
    expect(text).toMatch(/runs lean/);
  });

  it("the lowered-compression head checks squish and piston-to-valve clearance, with the readings to take", () => {
    const steps = stepsOf(cylinderHeadTemplate);
    const squish = steps.find((s) => s.key === "squish")!;
    const ptv = steps.find((s) => s.key === "piston-to-valve")!;
    expect(squish.measurements.map((m) => [m.key, m.unit, m.readingLabels.length])).toEqual([["squish-clearance", "mm", 4]]);
    expect(ptv.measurements.map((m) => m.key)).toEqual(["ptv-intake", "ptv-exhaust"]);
    // piston-to-valve is checked with the cams timed, squish with the head torqued
    const keys = steps.map((s) => s.key);
    expect(keys.indexOf("squish")).toBeGreaterThan(keys.indexOf("head-bolts"));
    expect(keys.indexOf("piston-to-valve")).toBeGreaterThan(keys.indexOf("cam-timing"));
  });

  it("the ten-times-displacement rule is about the intake side before the compressor, marked common practice", () => {
    const step = stepsOf(turboKitTemplate).find((s) => s.key === "larger-intake")!;
    expect(step.instructions).toMatch(/intake side before the compressor/);
    expect(step.instructions).toMatch(/ten times the engine's displacement/);
    expect(step.instructions).toMatch(/common practice/);
  });
});
