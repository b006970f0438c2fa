/**
 * What a shop saves by name to use again, and how each kind is checked: a dyno CSV column mapping
 * (lib/dyno/column-mapping.ts) and a compressor map outline copied from a maker's sheet
 * (lib/calc/compressor-map.ts; Benchtag ships none). A name saved again makes a newer entry; the
 * newest of a name is the one offered.
 */
import { z } from "zod";
import { CalcInputError, checkCompressorMapOutline, MAP_FLOW_UNITS, type CompressorMapOutline } from "@/lib/calc";
import type { Area } from "@/lib/auth/roles";
import { columnMappingSchema } from "@/lib/dyno/column-mapping";
import type { FieldIssue } from "@/lib/errors";
import { safeText } from "@/lib/safe-values";

export const PRESET_KINDS = ["dyno-csv-mapping", "compressor-map"] as const;
export type PresetKind = (typeof PRESET_KINDS)[number];

/** Who may read and save each kind: the area of the page that uses it. */
export const PRESET_AREA: Readonly<Record<PresetKind, Area>> = { "dyno-csv-mapping": "dyno", "compressor-map": "calculators" };

export const presetNameSchema = safeText({
  label: "Name",
  max: 80,
  min: 1,
  tooShort: "Give it a name (e.g. the logger or the compressor).",
});

const figure = (label: string) => z.number({ error: `${label} must be a number.` });
const mapPoint = z.object({ correctedFlow: figure("Corrected air flow"), pressureRatio: figure("Pressure ratio") }).strict();
const outlineShape = z
  .object({
    flowUnit: z.enum(MAP_FLOW_UNITS, { error: `Flow unit of the map must be ${MAP_FLOW_UNITS.join(" or ")}.` }),
    reference: z
      .object({ pressureKpa: figure("Map reference pressure"), temperatureK: figure("Map reference temperature") })
      .strict()
      .nullable()
      .optional(),
    surgeLine: z.array(mapPoint, { error: "Surge line must list points." }).max(50, "Surge line: at most 50 points."),
    chokeLine: z.array(mapPoint, { error: "Choke line must list points." }).max(50, "Choke line: at most 50 points."),
  })
  .strict();

type PresetBody =
  { kind: "dyno-csv-mapping"; body: z.output<typeof columnMappingSchema> } | { kind: "compressor-map"; body: CompressorMapOutline };

/** Checks a preset body of `kind`: the body as stored, or every problem in workshop words. */
export function checkPresetBody(kind: PresetKind, body: unknown): { ok: true; preset: PresetBody } | { ok: false; issues: FieldIssue[] } {
  const issuesOf = (error: z.ZodError) => error.issues.map((i) => ({ path: ["body", ...i.path].join("."), message: i.message }));
  if (kind === "dyno-csv-mapping") {
    const r = columnMappingSchema.safeParse(body);
    return r.success ? { ok: true, preset: { kind, body: r.data } } : { ok: false, issues: issuesOf(r.error) };
  }
  const shape = outlineShape.safeParse(body);
  if (!shape.success) return { ok: false, issues: issuesOf(shape.error) };
  try {
    const checked = checkCompressorMapOutline(shape.data);
    return { ok: true, preset: { kind, body: checked } };
  } catch (e) {
    if (e instanceof CalcInputError) return { ok: false, issues: [{ path: `body.${e.field}`, message: e.message }] };
    throw e;
  }
}
