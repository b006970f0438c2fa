/**
 * Validation of a run's curve rows (from the entry table or a CSV file): each row's engine speed
 * and torque, checked with zod; every problem is reported with its row and column, and a curve
 * with any problem yields no points at all.
 */
import { SHOP_TORQUE_UNITS, type ShopTorqueUnit } from "../shop-units";
import { z } from "zod";
import { convertTorque } from "@/lib/calc";
import { numberFromText } from "./number-text";

/** Torque units a curve may be recorded in. */
/** A curve is recorded in one of the shop's everyday torque units. */
export const CURVE_TORQUE_UNITS = SHOP_TORQUE_UNITS;
export type CurveTorqueUnit = ShopTorqueUnit;

const MIN_CURVE_POINTS = 2;
const MAX_CURVE_POINTS = 2000;
const MAX_RPM = 25000;

/** A problem in one cell (or one row when `column` is the whole row). */
export interface CurveRowError {
  /** Row number as the user sees it: the line in the file, or the table row (1-based). */
  row: number;
  column: string;
  message: string;
}

/** One row: rpm and torque (in the curve's unit). */
const curveRowSchema = z.object({
  rpm: numberFromText("Engine speed", 1, MAX_RPM, "rpm", { quoteBadValue: true }),
  torque: numberFromText("Torque", 0, 5000, "in the curve's unit", { quoteBadValue: true }),
});

interface RawCurveRow {
  /** Row number to report (file line or table row). */
  row: number;
  rpm: string | number;
  torque: string | number;
}

/** Names of the columns as the user sees them, for error messages. */
interface CurveColumnNames {
  rpm: string;
  torque: string;
}

type CurveRowsResult =
  { ok: true; points: Array<{ rpm: number; torque: number; torqueNm: number }> } | { ok: false; errors: CurveRowError[] };

/**
 * Checks every row, then the curve as a whole (rising rpm, point count). Torque is kept as given
 * (`torque`) and also converted to N·m (`torqueNm`) for the computations.
 */
export function validateCurveRows(rows: readonly RawCurveRow[], unit: CurveTorqueUnit, columns: CurveColumnNames): CurveRowsResult {
  const errors: CurveRowError[] = [];
  const points: Array<{ row: number; rpm: number; torque: number }> = [];
  for (const r of rows) {
    const parsed = curveRowSchema.safeParse({ rpm: r.rpm, torque: r.torque });
    if (parsed.success) {
      points.push({ row: r.row, ...parsed.data });
      continue;
    }
    for (const issue of parsed.error.issues) {
      const key = issue.path[0] === "torque" ? "torque" : "rpm";
      errors.push({ row: r.row, column: columns[key], message: issue.message });
    }
  }
  for (let i = 1; i < points.length; i++) {
    if (!(points[i].rpm > points[i - 1].rpm)) {
      errors.push({
        row: points[i].row,
        column: columns.rpm,
        message: `Engine speed must rise from row to row: ${points[i].rpm} rpm follows ${points[i - 1].rpm} rpm (row ${points[i - 1].row})`,
      });
    }
  }
  if (rows.length < MIN_CURVE_POINTS) {
    errors.push({
      row: rows.length ? rows[rows.length - 1].row : 1,
      column: "(whole curve)",
      message: `A curve needs at least ${MIN_CURVE_POINTS} points; got ${rows.length}`,
    });
  }
  if (rows.length > MAX_CURVE_POINTS) {
    errors.push({
      row: rows[MAX_CURVE_POINTS].row,
      column: "(whole curve)",
      message: `A curve may hold at most ${MAX_CURVE_POINTS} points; got ${rows.length}`,
    });
  }
  if (errors.length) return { ok: false, errors: errors.sort((a, b) => a.row - b.row) };
  return { ok: true, points: points.map((p) => ({ rpm: p.rpm, torque: p.torque, torqueNm: convertTorque(p.torque, unit, "N·m") })) };
}
