/**
 * The build's own figures as rows of words: what the job page, the review page and the handover
 * report all show, written once. Each row: what, the build's figure, the target beside it.
 */
import { formatNumber } from "@/lib/calc";
import type { BuildFigures, FigureUsed } from "./build-figures";

export interface FigureRow {
  label: string;
  actual: string;
  target: string;
}

const ratio = (x: number | null) => (x === null ? "—" : `${x.toFixed(2)}:1`);

/** The rows; figures that could not be worked out show "—" (the reasons are in `missing` and `problems`). */
export function buildFigureRows(f: BuildFigures): FigureRow[] {
  const boost = f.boostKpa === null ? null : `${formatNumber(Number(f.boostKpa.toFixed(1)))} kPa boost`;
  const targetBoosted =
    f.targetCompressionRatio !== null && f.compressionRatio !== null && f.boostedCompressionRatio !== null
      ? ratio((f.targetCompressionRatio * f.boostedCompressionRatio) / f.compressionRatio)
      : "—";
  const rows: FigureRow[] = [
    { label: "Compression ratio (from the readings)", actual: ratio(f.compressionRatio), target: ratio(f.targetCompressionRatio) },
    {
      label: `Boosted compression ratio${boost ? ` at ${boost}` : ""} (rule of thumb)`,
      actual: ratio(f.boostedCompressionRatio),
      target: targetBoosted,
    },
    { label: "Dynamic compression ratio", actual: ratio(f.dynamicCompressionRatio), target: "—" },
    {
      label: `Dynamic compression ratio, boosted${boost ? ` at ${boost}` : ""} (rule of thumb)`,
      actual: ratio(f.boostedDynamicCompressionRatio),
      target: "—",
    },
    { label: "Squish clearance (tightest cylinder)", actual: f.squishMm === null ? "—" : `${f.squishMm.toFixed(2)} mm`, target: "—" },
  ];
  return rows;
}

/** One figure used, in words: "Bore 76.00 mm (mean of 6 readings, 75.99–76.01)" or "… (build sheet)". */
export function figureUsedText(u: FigureUsed): string {
  const digits = u.unit === "°" ? 0 : 2;
  const value = u.unit === "°" ? `${formatNumber(u.value)}°` : `${u.value.toFixed(digits)} ${u.unit}`;
  if (u.source.kind === "build sheet") return `${u.label} ${value} (build sheet)`;
  const { count, min, max } = u.source;
  return count === 1
    ? `${u.label} ${value} (1 reading)`
    : `${u.label} ${value} (mean of ${count} readings, ${min.toFixed(digits)}–${max.toFixed(digits)})`;
}
