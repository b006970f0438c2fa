/**
 * What a new dyno run carries across the boundary (form → route handler): the run's facts as
 * zod-checked fields, and its curve either as table rows or as CSV text. Field messages name the
 * field and the limit; curve problems come back with their row and column.
 */
import { z } from "zod";
import { POWER_CORRECTION_STANDARD_IDS } from "@/lib/calc";
import type { FieldIssue } from "@/lib/errors";
import { parseCurveCsv } from "./curve-csv";
import { numberFromText } from "./number-text";
import { CURVE_TORQUE_UNITS, validateCurveRows, type CurveRowError, type CurveTorqueUnit } from "./curve-rows";

export const BOOST_UNITS = ["psi", "kPa", "bar"] as const;
export type BoostUnit = (typeof BOOST_UNITS)[number];

const dynoRunFieldsSchema = z.object({
  label: z.string().trim().min(1, "Name the run (e.g. “Baseline 7 psi”)").max(80, "Run name: at most 80 characters"),
  ranOn: z.iso.date({ message: "Date must be a date (YYYY-MM-DD)" }),
  boostTarget: numberFromText("Boost target", 0, 60, "(gauge)"),
  boostUnit: z.enum(BOOST_UNITS, { message: "Boost unit must be psi, kPa or bar" }),
  pressureKpa: numberFromText("Air pressure", 60, 110, "kPa"),
  temperatureC: numberFromText("Air temperature", -20, 55, "°C"),
  humidityPercent: numberFromText("Humidity", 0, 100, "%"),
  standard: z.enum(POWER_CORRECTION_STANDARD_IDS, { message: "Choose a correction standard" }),
  notes: z.string().max(2000, "Notes: at most 2000 characters").default(""),
});

const curveSchema = z.discriminatedUnion("source", [
  z.object({
    source: z.literal("table"),
    torqueUnit: z.enum(CURVE_TORQUE_UNITS, { message: "Torque unit must be N·m or lbf·ft" }),
    rows: z
      .array(z.object({ rpm: z.union([z.string(), z.number()]), torque: z.union([z.string(), z.number()]) }))
      .max(2000, "At most 2000 rows"),
  }),
  z.object({ source: z.literal("csv"), fileName: z.string().max(200).default(""), text: z.string() }),
]);

const dynoRunBodySchema = dynoRunFieldsSchema.extend({ curve: curveSchema });

type DynoRunFields = z.output<typeof dynoRunFieldsSchema>;

/** A checked run ready to store. */
export interface DynoRunInput extends DynoRunFields {
  source: "table" | "csv";
  torqueUnit: CurveTorqueUnit;
  points: Array<{ rpm: number; torque: number; torqueNm: number }>;
}

type DynoRunCheck = { ok: true; run: DynoRunInput } | { ok: false; fieldErrors: Record<string, string>; curveErrors: CurveRowError[] };

/**
 * Checks a request body. Blank table rows (both cells empty) are skipped; every other row counts.
 * Returns all field errors and all curve errors at once.
 */
export function checkDynoRunBody(body: unknown): DynoRunCheck {
  const fieldErrors: Record<string, string> = {};
  const parsed = dynoRunBodySchema.safeParse(body);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const key = issue.path.length ? String(issue.path[0]) : "form";
      fieldErrors[key] ??= issue.message;
    }
    // the curve is still checked below if its shape was right, so every problem shows at once
  }
  const raw = (body ?? {}) as { curve?: unknown };
  const curve = curveSchema.safeParse(raw.curve);
  let curveErrors: CurveRowError[] = [];
  let points: DynoRunInput["points"] = [];
  let torqueUnit: CurveTorqueUnit = "N·m";
  if (curve.success) {
    delete fieldErrors.curve;
    if (curve.data.source === "csv") {
      const r = parseCurveCsv(curve.data.text);
      if (r.ok) ({ points, torqueUnit } = r);
      else curveErrors = r.errors;
    } else {
      torqueUnit = curve.data.torqueUnit;
      const rows = curve.data.rows
        .map((r, i) => ({ row: i + 1, rpm: r.rpm, torque: r.torque }))
        .filter((r) => String(r.rpm).trim() !== "" || String(r.torque).trim() !== "");
      const r = validateCurveRows(rows, torqueUnit, { rpm: "Engine speed (rpm)", torque: `Torque (${torqueUnit})` });
      if (r.ok) points = r.points;
      else curveErrors = r.errors;
    }
  }
  if (!parsed.success || curveErrors.length || Object.keys(fieldErrors).length) {
    return { ok: false, fieldErrors, curveErrors };
  }
  return { ok: true, run: { ...parsed.data, source: parsed.data.curve.source, torqueUnit, points } };
}

/**
 * A refused run's problems as one list of issues (the answer's `issues`): each field by its name,
 * each curve problem as "curve.<row>.<column>" (row as the user sees it: file line or table row).
 */
export function runIssues(check: { fieldErrors: Record<string, string>; curveErrors: CurveRowError[] }): FieldIssue[] {
  return [
    ...Object.entries(check.fieldErrors).map(([path, message]) => ({ path, message })),
    ...check.curveErrors.map((e) => ({ path: `curve.${e.row}.${e.column}`, message: e.message })),
  ];
}

/** The other way, for the form: field messages by name and the curve problems with row and column. */
export function runProblems(issues: readonly FieldIssue[]): { fieldErrors: Record<string, string>; curveErrors: CurveRowError[] } {
  const fieldErrors: Record<string, string> = {};
  const curveErrors: CurveRowError[] = [];
  for (const i of issues) {
    const m = /^curve\.(\d+)\.(.*)$/s.exec(i.path);
    if (m) curveErrors.push({ row: Number(m[1]), column: m[2], message: i.message });
    else fieldErrors[i.path] ??= i.message;
  }
  return { fieldErrors, curveErrors };
}
