/**
 * What a new dyno run carries across the boundary (form → route handler): the run's facts as
 * zod-checked fields, the tune it ran and its fuel, and its curve as table rows, as a CSV file of our
 * own curve format, or as a logged file with a column mapping. Field messages name the field and the
 * limit; curve problems come back with their row (file line) and column.
 */
import { calendarDay } from "@/lib/calendar/rules";
import { z } from "zod";
import { FUEL_IDS, INPUT_RULES, POWER_CORRECTION_STANDARD_IDS, type FuelId } from "@/lib/calc";
import type { FieldIssue } from "@/lib/errors";
import { safeText } from "@/lib/safe-values";
import { BOOST_UNITS, boostTargetProblem } from "./boost";
import { columnMappingSchema } from "./column-mapping";
import { parseCurveCsv } from "./curve-csv";
import { parseLoggedCsv, type LoggedChannel } from "./logged-csv";
import { numberFromText } from "./number-text";
import { CURVE_TORQUE_UNITS, validateCurveRows, type CurveRowError, type CurveTorqueUnit } from "./curve-rows";
import type { ChannelId } from "./channels";

const station = INPUT_RULES.stationPressure;

const dynoRunFieldsSchema = z
  .object({
    label: safeText({ label: "Run name", max: 80, min: 1, tooShort: "Name the run (e.g. “Baseline 7 psi”)" }),
    ranOn: calendarDay("Date"),
    boostTarget: numberFromText("Boost target", 0, Number.MAX_VALUE, "(gauge)"),
    boostUnit: z.enum(BOOST_UNITS, { message: "Boost unit must be psi, kPa or bar" }),
    pressureKpa: numberFromText("Air pressure", station.min, station.max, "kPa"),
    temperatureC: numberFromText("Air temperature", -20, 55, "°C"),
    humidityPercent: numberFromText("Humidity", 0, 100, "%"),
    standard: z.enum(POWER_CORRECTION_STANDARD_IDS, { message: "Choose a correction standard" }),
    notes: safeText({ label: "Notes", max: 2000, multiline: true }).default(""),
    fuel: z
      .union([z.enum(FUEL_IDS), z.literal(""), z.null()], { message: `Fuel must be one of ${FUEL_IDS.join(", ")}` })
      .default(null)
      .transform((f): FuelId | null => (f === "" ? null : f)),
    // A tune of the work order, or null said outright ("no tune file of ours"). Left out, the run
    // names none; the store refuses that when the work order has tune versions (db/records/dyno.ts).
    tuneVersionId: z.union([z.uuid(), z.null()], { message: "Tune: choose one of this work order's tunes, or none." }).optional(),
  })
  .superRefine((f, ctx) => {
    const problem = boostTargetProblem(f.boostTarget, f.boostUnit);
    if (problem) ctx.addIssue({ code: "custom", path: ["boostTarget"], message: problem });
  });

const fileName = z.string().max(200, "File name: at most 200 characters").default("");

const curveSchema = z.discriminatedUnion("source", [
  z.object({
    source: z.literal("table"),
    torqueUnit: z.enum(CURVE_TORQUE_UNITS, { message: "Torque unit must be N·m or lbf·ft" }),
    rows: z
      .array(z.object({ rpm: z.union([z.string(), z.number()]), torque: z.union([z.string(), z.number()]) }))
      .max(2000, "At most 2000 rows"),
  }),
  z.object({ source: z.literal("csv"), fileName, text: z.string() }),
  z.object({ source: z.literal("mapped-csv"), fileName, text: z.string(), mapping: z.unknown() }),
]);

const dynoRunBodySchema = z.intersection(dynoRunFieldsSchema, z.object({ curve: curveSchema }));

type DynoRunFields = z.output<typeof dynoRunFieldsSchema>;

/** A checked run ready to store. */
export interface DynoRunInput extends DynoRunFields {
  source: "table" | "csv" | "mapped-csv";
  torqueUnit: CurveTorqueUnit;
  points: Array<{ rpm: number; torque: number; torqueNm: number; logged?: Partial<Record<ChannelId, number>> }>;
  /** Channels logged (mapped files only). */
  channels: LoggedChannel[];
}

type DynoRunCheck = { ok: true; run: DynoRunInput } | { ok: false; fieldErrors: Record<string, string>; curveErrors: CurveRowError[] };

// The fuel and air pressure read alone, so a logged file is checked even when other fields are wrong.
const fuelAlone = z.object({ fuel: z.enum(FUEL_IDS) });
const pressureAlone = z.object({ pressureKpa: numberFromText("Air pressure", station.min, station.max, "kPa") });

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
  let channels: LoggedChannel[] = [];
  let torqueUnit: CurveTorqueUnit = "N·m";
  if (curve.success) {
    delete fieldErrors.curve;
    const c = curve.data;
    if (c.source === "csv") {
      const r = parseCurveCsv(c.text);
      if (r.ok) ({ points, torqueUnit } = r);
      else curveErrors = r.errors;
    } else if (c.source === "mapped-csv") {
      const mapping = columnMappingSchema.safeParse(c.mapping);
      if (!mapping.success) {
        curveErrors = mapping.error.issues.map((i) => ({ row: 1, column: "(mapping)", message: i.message }));
      } else {
        const fuelRead = fuelAlone.safeParse(body);
        const pressureRead = pressureAlone.safeParse(body);
        const fuel = fuelRead.success ? fuelRead.data.fuel : null;
        const r = parseLoggedCsv(c.text, mapping.data, {
          fuel,
          stationPressureKpa: pressureRead.success ? pressureRead.data.pressureKpa : null,
        });
        if (r.ok) ({ points, torqueUnit, channels } = r);
        else curveErrors = r.errors;
        if (channels.some((ch) => ch.channel === "mixture") && fuel === null) {
          fieldErrors.fuel ??= "Name the fuel of the run: the file logs the mixture, read with the fuel's stoichiometric ratio.";
        }
      }
    } else {
      torqueUnit = c.torqueUnit;
      const rows = c.rows
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
  const { curve: given, ...fields } = parsed.data;
  return { ok: true, run: { ...fields, source: given.source, torqueUnit, points, channels } };
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
