/**
 * A logged dyno file read through a column mapping (./column-mapping.ts). The file:
 *   - line 1 names the columns; then one line per logged point, engine speed rising;
 *   - separated by commas, semicolons or tabs (found from line 1), `.` as the decimal mark;
 *   - blank lines are skipped; 2 to 2000 points; at most 1 000 000 characters.
 * Engine speed and torque must be in every line; a channel's cell may be empty where the logger
 * wrote nothing. Columns the mapping does not name are not read.
 * A file with any problem is refused whole: every problem comes back with its line (line 1 is the
 * header) and the file's column name, and nothing is kept.
 */
import Papa from "papaparse";
import type { FuelId } from "@/lib/calc/fuels";
import { channelValueProblem, runChannelContext, type ChannelId } from "./channels";
import { isChannel, targetLabel, type ColumnMapping } from "./column-mapping";
import { CURVE_TORQUE_UNITS, validateCurveRows, type CurveRowError, type CurveTorqueUnit } from "./curve-rows";

export const MAX_LOGGED_CSV_CHARS = 1_000_000;

export interface LoggedPoint {
  rpm: number;
  /** In the file's torque unit, as written. */
  torque: number;
  torqueNm: number;
  /** Channel values as written (in each channel's unit of the mapping); absent where the cell was empty. */
  logged: Partial<Record<ChannelId, number>>;
}

export interface LoggedChannel {
  channel: ChannelId;
  unit: string;
  /** The file's column it came from. */
  sourceColumn: string;
}

export type LoggedCsvResult =
  { ok: true; torqueUnit: CurveTorqueUnit; points: LoggedPoint[]; channels: LoggedChannel[] } | { ok: false; errors: CurveRowError[] };

const DELIMITERS = [",", ";", "\t"];

/** A cell as a number, or the problem: "." only as the decimal mark. */
function cellNumber(text: string, label: string): { value: number } | { problem: string } {
  const t = text.trim();
  if (/^[-+]?\d+,\d+$/.test(t)) return { problem: `${label} "${t}" uses a comma as the decimal mark; write ${t.replace(",", ".")}.` };
  const n = Number(t);
  if (t === "" || !Number.isFinite(n)) return { problem: `${label} must be a number; got "${t.length > 40 ? `${t.slice(0, 40)}…` : t}".` };
  return { value: n };
}

/**
 * Reads `text` with `mapping`. `fuel` names the run's fuel (needed to read an air-fuel ratio as
 * lambda); `stationPressureKpa` turns absolute manifold pressure into boost.
 */
export function parseLoggedCsv(
  text: string,
  mapping: ColumnMapping,
  run: { fuel: FuelId | null; stationPressureKpa: number | null },
): LoggedCsvResult {
  if (text.length > MAX_LOGGED_CSV_CHARS) {
    return {
      ok: false,
      errors: [{ row: 1, column: "(file)", message: `The file is larger than ${MAX_LOGGED_CSV_CHARS / 1_000_000} MB.` }],
    };
  }
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), { skipEmptyLines: false, delimitersToGuess: DELIMITERS });
  const lines = parsed.data;
  const errors: CurveRowError[] = [];
  for (const e of parsed.errors) {
    if (e.code === "UndetectableDelimiter") continue;
    errors.push({ row: (e.row ?? 0) + 1, column: "(line)", message: e.message });
  }
  const header = (lines[0] ?? []).map((h) => h.trim());
  if (header.every((h) => h === "")) {
    return { ok: false, errors: [{ row: 1, column: "(header)", message: "The file is empty: line 1 must name the columns." }] };
  }
  const index = new Map<string, number>();
  header.forEach((h, i) => {
    const key = h.toLowerCase();
    if (index.has(key))
      errors.push({ row: 1, column: h, message: `Two columns are named "${h}": rename one so the mapping can tell them apart.` });
    else index.set(key, i);
  });
  const where = mapping.columns.map((c) => ({ ...c, at: index.get(c.column.toLowerCase()) }));
  for (const c of where) {
    if (c.at === undefined) {
      errors.push({
        row: 1,
        column: c.column,
        message: `The mapping's column "${c.column}" (${targetLabel(c.channel).toLowerCase()}) is not in line 1 of the file.`,
      });
    }
  }
  if (errors.some((e) => e.row === 1)) return { ok: false, errors };

  const rpmCol = where.find((c) => c.channel === "rpm")!;
  const torqueCol = where.find((c) => c.channel === "torque")!;
  const channelCols = where.filter((c): c is typeof c & { channel: ChannelId; at: number } => isChannel(c.channel) && c.at !== undefined);
  const torqueUnit = CURVE_TORQUE_UNITS.find((u) => u === torqueCol.unit) ?? "N·m";
  const ctx = runChannelContext(run.fuel, run.stationPressureKpa);

  const rows: Array<{ row: number; rpm: string; torque: string }> = [];
  const logged: Array<Partial<Record<ChannelId, number>>> = [];
  for (const [i, cells] of lines.entries()) {
    if (i === 0 || cells.every((c) => c.trim() === "")) continue;
    const row = i + 1;
    if (cells.length !== header.length) {
      errors.push({ row, column: "(line)", message: `Line 1 names ${header.length} columns; this line has ${cells.length} values.` });
      continue;
    }
    rows.push({ row, rpm: cells[rpmCol.at!], torque: cells[torqueCol.at!] });
    const values: Partial<Record<ChannelId, number>> = {};
    for (const c of channelCols) {
      const cell = cells[c.at];
      if (cell.trim() === "") continue; // not logged at this point
      const label = targetLabel(c.channel);
      const n = cellNumber(cell, label);
      if ("problem" in n) {
        errors.push({ row, column: c.column, message: n.problem });
        continue;
      }
      const problem = channelValueProblem(c.channel, c.unit, n.value, ctx);
      if (problem) errors.push({ row, column: c.column, message: problem });
      else values[c.channel] = n.value;
    }
    logged.push(values);
  }
  const curve = validateCurveRows(rows, torqueUnit, { rpm: rpmCol.column, torque: torqueCol.column });
  if (!curve.ok) errors.push(...curve.errors);
  if (errors.length || !curve.ok) return { ok: false, errors: errors.sort((a, b) => a.row - b.row) };
  return {
    ok: true,
    torqueUnit,
    points: curve.points.map((p, i) => ({ ...p, logged: logged[i] })),
    channels: channelCols.map((c) => ({ channel: c.channel, unit: c.unit, sourceColumn: c.column })),
  };
}
