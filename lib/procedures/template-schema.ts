import { z } from "zod";
import { MEASUREMENT_UNITS, TORQUE_UNITS } from "../calc/units";
import { beyondWrenchLimit, MAX_READING } from "../sync/operations";
import "../zod-issues";

// Benchtag's own procedure-template document ("benchtag-template", format version 1).
// The office imports and exports templates in this shape; the seed writes the demo ones from it.
// Units: torque in the named unit, lengths in the named unit, durations in seconds.

export const CAUTION_KINDS = ["hot", "boost", "fuel", "lifting", "torque-to-yield", "chemical", "general"] as const;
export type CautionKind = (typeof CAUTION_KINDS)[number];
/** The order bolts are tightened in, drawn on the bench. */
export const BOLT_PATTERNS = ["cross", "spiral-out", "linear"] as const;
export type BoltPattern = (typeof BOLT_PATTERNS)[number];
/** What a measurement's readings describe, for the worked-out figures (bore taper, oil clearance). */
export const MEASUREMENT_GEOMETRIES = ["bore", "oil-clearance"] as const;
export type MeasurementGeometry = (typeof MEASUREMENT_GEOMETRIES)[number];

/** A template's, stage's or step's key: lower-case letters, digits and dashes, at most 63. */
export const TEMPLATE_KEY_PATTERN = /^[a-z0-9][a-z0-9-]{0,62}$/;
const key = z.string().regex(TEMPLATE_KEY_PATTERN, "use lower-case letters, digits and dashes (max 63)");

export const cautionSchema = z.object({
  kind: z.enum(CAUTION_KINDS),
  text: z.string().trim().min(3).max(500),
});

export const torquePassSchema = z.union([
  z.object({ percent: z.number().gt(0).max(100) }).strict(),
  z.object({ value: z.number().positive() }).strict(),
]);

export const torqueSpecSchema = z
  .object({
    label: z.string().trim().min(1).max(120),
    finalValue: z.number().positive(),
    unit: z.enum(TORQUE_UNITS),
    passes: z.array(torquePassSchema).max(8).default([]),
    anglePasses: z.array(z.number().gt(0).max(360)).max(4).default([]),
    pattern: z.enum(BOLT_PATTERNS),
    boltCount: z.number().int().min(1).max(64),
    lubricant: z.string().max(200).default(""),
    torqueToYield: z.boolean().default(false),
  })
  .strict()
  // no fastener on a motorcycle engine comes near the wrench limit of its unit (lib/sync/operations.ts)
  .superRefine((t, ctx) => {
    const check = (value: number, path: (string | number)[], what: string) => {
      const beyond = beyondWrenchLimit(what, value, t.unit);
      if (beyond) ctx.addIssue({ code: "custom", path, message: `${beyond}.` });
    };
    check(t.finalValue, ["finalValue"], "Final value");
    t.passes.forEach((p, i) => "value" in p && check(p.value, ["passes", i, "value"], `Pass ${i + 1}`));
  });

const measurementSpecSchema = z
  .object({
    key,
    label: z.string().trim().min(1).max(120),
    // a metre in µm is the most any reading may be, either way (MAX_READING): the same bound as the bench's readings
    nominal: z.number().min(-MAX_READING).max(MAX_READING).nullable().default(null),
    min: z.number().min(-MAX_READING).max(MAX_READING),
    max: z.number().min(-MAX_READING).max(MAX_READING),
    unit: z.enum(MEASUREMENT_UNITS),
    readingLabels: z.array(z.string().trim().min(1).max(40)).max(64).default([]),
    geometry: z.enum(MEASUREMENT_GEOMETRIES).nullable().default(null),
  })
  .strict()
  .refine((m) => m.min <= m.max, { message: "min must not exceed max", path: ["min"] })
  .refine((m) => m.nominal === null || (m.nominal >= m.min && m.nominal <= m.max), {
    message: "nominal must lie between min and max",
    path: ["nominal"],
  });

const timerSpecSchema = z
  .object({
    label: z.string().trim().min(1).max(120),
    durationS: z
      .number()
      .int()
      .positive()
      .max(7 * 24 * 3600),
    blocksStepKey: key.nullable().default(null),
  })
  .strict();

const stepSchema = z
  .object({
    key,
    title: z.string().trim().min(1).max(160),
    instructions: z.string().max(4000).default(""),
    cautions: z.array(cautionSchema).max(10).default([]),
    requiresPhoto: z.boolean().default(false),
    torque: z.array(torqueSpecSchema).max(6).default([]),
    measurements: z.array(measurementSpecSchema).max(20).default([]),
    timer: timerSpecSchema.nullable().default(null),
  })
  .strict();

const stageSchema = z
  .object({
    key,
    title: z.string().trim().min(1).max(120),
    steps: z.array(stepSchema).min(1).max(100),
  })
  .strict();

export const templateDocumentSchema = z
  .object({
    format: z.literal("benchtag-template"),
    formatVersion: z.literal(1),
    key,
    name: z.string().trim().min(1).max(160),
    summary: z.string().max(2000).default(""),
    exampleOnly: z.boolean().default(false),
    stages: z.array(stageSchema).min(1).max(30),
  })
  .strict()
  .superRefine((doc, ctx) => {
    const stepKeys = new Set<string>();
    doc.stages.forEach((stage, si) =>
      stage.steps.forEach((step, pi) => {
        if (stepKeys.has(step.key)) {
          ctx.addIssue({ code: "custom", message: `step key "${step.key}" is used twice`, path: ["stages", si, "steps", pi, "key"] });
        }
        stepKeys.add(step.key);
      }),
    );
    doc.stages.forEach((stage, si) =>
      stage.steps.forEach((step, pi) => {
        const blocks = step.timer?.blocksStepKey;
        if (blocks && !stepKeys.has(blocks)) {
          ctx.addIssue({
            code: "custom",
            message: `timer blocks unknown step "${blocks}"`,
            path: ["stages", si, "steps", pi, "timer", "blocksStepKey"],
          });
        }
      }),
    );
    const stageKeys = doc.stages.map((s) => s.key);
    if (new Set(stageKeys).size !== stageKeys.length) {
      ctx.addIssue({ code: "custom", message: "stage keys must be unique", path: ["stages"] });
    }
  });

export type TemplateDocument = z.output<typeof templateDocumentSchema>;
export type TemplateDocumentInput = z.input<typeof templateDocumentSchema>;
