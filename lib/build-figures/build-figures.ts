/**
 * The build's own figures, worked out from the job's readings (bore, stroke, chamber volume,
 * compressed gasket, piston to deck …) with the build sheet filling what the bench does not
 * measure (piston dish, gasket bore, rod length, intake closing): the actual compression ratio,
 * its boosted form, the dynamic ratio and its boosted form, squish, and the target beside each.
 *
 * Readings are found by their spec key (README "Build figures"): a spec keyed `bore`, `stroke`,
 * `chamber-volume`, `deck-clearance` or `gasket-thickness`, or one of these followed by `-` and
 * anything (`bore-1`, `chamber-volume-cyl-2`). All current readings of one kind are averaged for
 * the compression figures; squish uses the smallest piston-to-deck reading (the tightest cylinder).
 */
import {
  boostedCompressionRatio,
  boostedDynamicCompressionRatio,
  CalcInputError,
  compressionVolumes,
  convertLength,
  isLengthUnit,
  squishClearanceMm,
  STANDARD_ATMOSPHERE_KPA,
  type MeasurementUnit,
} from "@/lib/calc";
import { SHEET_FIELDS, type BuildSheet } from "./build-sheet";

export const READING_KINDS = ["bore", "stroke", "chamber-volume", "deck-clearance", "gasket-thickness"] as const;
export type ReadingKind = (typeof READING_KINDS)[number];

/** What each reading kind is, its unit kind, and the build sheet figure that stands in when it is not measured. */
const KIND_INFO: Record<
  ReadingKind,
  { label: string; volume: boolean; sheet: "boreMm" | "strokeMm" | "chamberCc" | "deckClearanceMm" | "gasketThicknessMm" }
> = {
  bore: { label: "Bore", volume: false, sheet: "boreMm" },
  stroke: { label: "Stroke", volume: false, sheet: "strokeMm" },
  "chamber-volume": { label: "Chamber volume", volume: true, sheet: "chamberCc" },
  "deck-clearance": { label: "Piston to deck at TDC", volume: false, sheet: "deckClearanceMm" },
  "gasket-thickness": { label: "Compressed gasket thickness", volume: false, sheet: "gasketThicknessMm" },
};

/** A current reading of the job, with its spec's key. */
export interface BuildReading {
  specKey: string;
  value: number;
  unit: MeasurementUnit;
}

/** The kind of figure a spec key gives, or null. */
export function readingKindOf(specKey: string): ReadingKind | null {
  return READING_KINDS.find((k) => specKey === k || specKey.startsWith(`${k}-`)) ?? null;
}

export interface FigureUsed {
  label: string;
  /** mm, or cc for volumes. */
  value: number;
  unit: "mm" | "cc" | "°";
  /** Where it came from: the mean of n readings, or the build sheet. */
  source: { kind: "readings"; count: number; min: number; max: number } | { kind: "build sheet" };
}

export interface BuildFigures {
  /** The figures used, in the order of the calculation. */
  used: FigureUsed[];
  /** What is missing for each figure that could not be worked out, in workshop words. */
  missing: string[];
  /** Readings of a known key that could not be used (wrong kind of unit), in workshop words. */
  problems: string[];
  compressionRatio: number | null;
  targetCompressionRatio: number | null;
  /** Planned boost used for the boosted figures, kPa gauge; null without one. */
  boostKpa: number | null;
  /** Static ratio × absolute manifold pressure ÷ station (common practice rule of thumb). */
  boostedCompressionRatio: number | null;
  dynamicCompressionRatio: number | null;
  boostedDynamicCompressionRatio: number | null;
  squishMm: number | null;
  sweptCc: number | null;
  clearanceCc: number | null;
}

function toMm(r: BuildReading): number | null {
  return isLengthUnit(r.unit) ? convertLength(r.value, r.unit, "mm") : null;
}

/**
 * Works out the build's own figures. `boostKpa` is the planned boost (build sheet, or the job's
 * dyno boost target); `stationPressureKpa` defaults to 101.325 kPa.
 */
export function buildFiguresFromReadings(input: {
  readings: readonly BuildReading[];
  sheet: BuildSheet;
  boostKpa?: number | null;
  stationPressureKpa?: number | null;
}): BuildFigures {
  const { sheet } = input;
  const used: FigureUsed[] = [];
  const missing: string[] = [];
  const problems: string[] = [];
  const values: Partial<Record<ReadingKind, { mean: number; min: number }>> = {};

  for (const kind of READING_KINDS) {
    const info = KIND_INFO[kind];
    const nums: number[] = [];
    for (const r of input.readings) {
      if (readingKindOf(r.specKey) !== kind) continue;
      const v = info.volume ? (r.unit === "cc" ? r.value : null) : toMm(r);
      if (v === null || !Number.isFinite(v)) {
        problems.push(`${info.label}: the reading of ${r.specKey} is in ${r.unit}, not ${info.volume ? "cc" : "a length"}; left out.`);
      } else nums.push(v);
    }
    if (nums.length) {
      const mean = nums.reduce((a, b) => a + b, 0) / nums.length;
      const min = Math.min(...nums);
      values[kind] = { mean, min };
      used.push({
        label: info.label,
        value: mean,
        unit: info.volume ? "cc" : "mm",
        source: { kind: "readings", count: nums.length, min, max: Math.max(...nums) },
      });
      continue;
    }
    const fromSheet = sheet.figures[info.sheet];
    if (fromSheet !== undefined) {
      values[kind] = { mean: fromSheet, min: fromSheet };
      used.push({ label: info.label, value: fromSheet, unit: info.volume ? "cc" : "mm", source: { kind: "build sheet" } });
    }
  }
  const sheetFigure = (key: "pistonDishCc" | "gasketBoreMm" | "rodLengthMm" | "intakeClosesDegAbdc") => {
    const v = sheet.figures[key];
    if (v !== undefined)
      used.push({
        label: SHEET_FIELDS[key].label,
        value: v,
        unit: key === "intakeClosesDegAbdc" ? "°" : key === "pistonDishCc" ? "cc" : "mm",
        source: { kind: "build sheet" },
      });
    return v;
  };
  const dish = sheetFigure("pistonDishCc");
  const gasketBore = sheetFigure("gasketBoreMm");
  const rod = sheetFigure("rodLengthMm");
  const ivc = sheetFigure("intakeClosesDegAbdc");

  const need = (what: string, parts: Array<[string, unknown]>) => {
    const lacking = parts.filter(([, v]) => v === undefined).map(([n]) => n);
    if (lacking.length) missing.push(`${what}: needs ${lacking.join(", ")}.`);
    return lacking.length === 0;
  };
  const calc = <T>(what: string, f: () => T): T | null => {
    try {
      return f();
    } catch (e) {
      if (!(e instanceof CalcInputError)) throw e;
      problems.push(`${what}: ${e.message}`);
      return null;
    }
  };

  const bore = values.bore?.mean;
  const stroke = values.stroke?.mean;
  const chamber = values["chamber-volume"]?.mean;
  const deck = values["deck-clearance"]?.mean;
  const gasket = values["gasket-thickness"]?.mean;
  const station = input.stationPressureKpa ?? sheet.figures.stationPressureKpa ?? STANDARD_ATMOSPHERE_KPA;
  const boostKpa = input.boostKpa ?? sheet.figures.boostKpa ?? null;

  let compressionRatio: number | null = null;
  let sweptCc: number | null = null;
  let clearanceCc: number | null = null;
  if (
    need("Compression ratio", [
      ["bore", bore],
      ["stroke", stroke],
      ["chamber volume", chamber],
      ["gasket bore", gasketBore],
      ["compressed gasket thickness", gasket],
      ["piston to deck", deck],
      ["piston dish", dish],
    ])
  ) {
    const vol = calc("Compression ratio", () =>
      compressionVolumes({
        boreMm: bore!,
        strokeMm: stroke!,
        chamberCc: chamber!,
        gasketBoreMm: gasketBore!,
        gasketThicknessMm: gasket!,
        deckClearanceMm: deck!,
        pistonDishCc: dish!,
      }),
    );
    if (vol) {
      sweptCc = vol.sweptCc;
      clearanceCc = vol.clearanceCc;
      compressionRatio = (vol.sweptCc + vol.clearanceCc) / vol.clearanceCc;
    }
  }
  let boosted: number | null = null;
  if (compressionRatio !== null && boostKpa !== null)
    boosted = calc("Boosted compression ratio", () => boostedCompressionRatio(compressionRatio!, boostKpa, station));

  let dynamic: number | null = null;
  let boostedDynamic: number | null = null;
  if (
    compressionRatio !== null &&
    need("Dynamic compression ratio", [
      ["rod length", rod],
      ["intake valve closing", ivc],
    ])
  ) {
    const r = calc("Dynamic compression ratio", () =>
      boostedDynamicCompressionRatio({
        boreMm: bore!,
        strokeMm: stroke!,
        rodLengthMm: rod!,
        staticCompressionRatio: compressionRatio!,
        intakeClosesDegAbdc: ivc!,
        boostKpa: boostKpa ?? 0,
        stationPressureKpa: station,
      }),
    );
    if (r) {
      dynamic = r.dynamicRatio;
      boostedDynamic = boostKpa === null ? null : r.boostedRatio;
    }
  }

  let squishMm: number | null = null;
  const tightestDeck = values["deck-clearance"]?.min;
  if (
    need("Squish clearance", [
      ["compressed gasket thickness", gasket],
      ["piston to deck", tightestDeck],
    ])
  ) {
    squishMm = calc("Squish clearance", () => squishClearanceMm({ deckClearanceMm: tightestDeck!, compressedGasketMm: gasket! }));
  }

  return {
    used,
    missing,
    problems,
    compressionRatio,
    targetCompressionRatio: sheet.figures.targetCompressionRatio ?? null,
    boostKpa,
    boostedCompressionRatio: boosted,
    dynamicCompressionRatio: dynamic,
    boostedDynamicCompressionRatio: boostedDynamic,
    squishMm,
    sweptCc,
    clearanceCc,
  };
}
