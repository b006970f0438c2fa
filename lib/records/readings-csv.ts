/**
 * A bike's readings as CSV (our own column list, README "Readings CSV"): every reading ever taken,
 * corrected ones too, with its value exactly as typed — "0.030" stays "0.030", so the instrument's
 * resolution survives into the spreadsheet. UTF-8, comma separated, CRLF line ends, RFC 4180
 * quoting (papaparse). A text cell a spreadsheet would run as a formula is prefixed with ', as in
 * the audit log CSV; a plain decimal (a negative reading) is a number, not a formula, and is kept.
 */
import Papa from "papaparse";
import { FORMULA_START } from "@/lib/review/audit-csv";

export const READINGS_CSV_COLUMNS = [
  "work_order",
  "step",
  "reading",
  "value",
  "unit",
  "min",
  "max",
  "verdict",
  "standing",
  "recorded_by",
  "recorded_at",
] as const;

export interface ReadingCsvRow {
  workOrderNumber: number;
  stepTitle: string;
  /** The spec's label and the reading's own label ("Cylinder 1 bore, Top thrust"). */
  reading: string;
  /** As stored: the decimal text typed. */
  value: string;
  unit: string;
  min: string;
  max: string;
  verdict: "in" | "low" | "high";
  /** "current", "corrected" (a later reading replaced it) or "earlier" (another reading of the spot counts). */
  standing: "current" | "corrected" | "earlier";
  recordedBy: string;
  recordedAt: string;
}

const DECIMAL = /^-?\d+(\.\d+)?$/;
const safe = (cell: string) => (FORMULA_START.test(cell) && !DECIMAL.test(cell) ? `'${cell}` : cell);

export function readingsCsv(rows: readonly ReadingCsvRow[]): string {
  const data = rows.map((r) =>
    [
      String(r.workOrderNumber),
      r.stepTitle,
      r.reading,
      r.value,
      r.unit,
      r.min,
      r.max,
      r.verdict,
      r.standing,
      r.recordedBy,
      r.recordedAt,
    ].map(safe),
  );
  const text = Papa.unparse({ fields: [...READINGS_CSV_COLUMNS], data }, { newline: "\r\n", quotes: false, escapeFormulae: false });
  return text.endsWith("\r\n") ? text : `${text}\r\n`;
}
