/**
 * Benchtag's dyno curve CSV (documented in README, "Dyno curve CSV"):
 *   - first line: column names; `rpm` and exactly one torque column, `torque_nm` (N·m) or
 *     `torque_lbft` (lbf·ft); no other columns;
 *   - then one line per point, engine speed rising; comma separated, `.` as the decimal mark;
 *   - blank lines are ignored; at most 2000 points.
 * Parsed with papaparse; each cell checked by {@link validateCurveRows}. Errors name the file line
 * (line 1 is the header) and the column.
 */
import Papa from "papaparse";
import { validateCurveRows, type CurveRowError, type CurveTorqueUnit } from "./curve-rows";

const CURVE_CSV_TORQUE_COLUMNS: Record<string, CurveTorqueUnit> = { torque_nm: "N·m", torque_lbft: "lbf·ft" };
const MAX_CURVE_CSV_BYTES = 200_000;

type CurveCsvResult =
  | { ok: true; torqueUnit: CurveTorqueUnit; points: Array<{ rpm: number; torque: number; torqueNm: number }> }
  | { ok: false; errors: CurveRowError[] };

export function parseCurveCsv(text: string): CurveCsvResult {
  if (text.length > MAX_CURVE_CSV_BYTES) {
    return { ok: false, errors: [{ row: 1, column: "(file)", message: `The file is larger than ${MAX_CURVE_CSV_BYTES / 1000} kB` }] };
  }
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), { skipEmptyLines: false });
  const lines = parsed.data;
  const errors: CurveRowError[] = [];
  for (const e of parsed.errors) {
    if (e.code === "UndetectableDelimiter") continue; // a one-column file: reported below by column name
    errors.push({ row: (e.row ?? 0) + 1, column: "(line)", message: e.message });
  }
  const header = (lines[0] ?? []).map((h) => h.trim().toLowerCase());
  if (header.length === 0 || header.every((h) => h === "")) {
    return {
      ok: false,
      errors: [{ row: 1, column: "(header)", message: "The file is empty: line 1 must name the columns rpm and torque_nm or torque_lbft" }],
    };
  }
  const rpmIndex = header.indexOf("rpm");
  const torqueColumns = header.filter((h) => h in CURVE_CSV_TORQUE_COLUMNS);
  for (const h of header) {
    if (h !== "rpm" && !(h in CURVE_CSV_TORQUE_COLUMNS)) {
      errors.push({ row: 1, column: h || "(blank)", message: `Unknown column "${h}": allowed are rpm, torque_nm, torque_lbft` });
    }
  }
  if (rpmIndex < 0) errors.push({ row: 1, column: "rpm", message: "Column rpm is missing" });
  if (torqueColumns.length !== 1) {
    errors.push({
      row: 1,
      column: torqueColumns.join(", ") || "torque_nm",
      message: torqueColumns.length
        ? "Give one torque column only (torque_nm or torque_lbft)"
        : "Column torque_nm or torque_lbft is missing",
    });
  }
  if (errors.length) return { ok: false, errors };

  const torqueColumn = torqueColumns[0];
  const torqueIndex = header.indexOf(torqueColumn);
  const rows = [];
  for (const [i, cells] of lines.entries()) {
    if (i === 0 || cells.every((c) => c.trim() === "")) continue;
    if (cells.length !== header.length) {
      errors.push({ row: i + 1, column: "(line)", message: `Expected ${header.length} values, found ${cells.length}` });
      continue;
    }
    rows.push({ row: i + 1, rpm: cells[rpmIndex], torque: cells[torqueIndex] });
  }
  const unit = CURVE_CSV_TORQUE_COLUMNS[torqueColumn];
  const checked = validateCurveRows(rows, unit, { rpm: "rpm", torque: torqueColumn });
  if (!checked.ok || errors.length) {
    return { ok: false, errors: [...errors, ...(checked.ok ? [] : checked.errors)].sort((a, b) => a.row - b.row) };
  }
  return { ok: true, torqueUnit: unit, points: checked.points };
}
