/**
 * A compressor map outline the user copies from the maker's sheet — the surge line and the choke
 * points, as corrected air flow against pressure ratio — and the check of operating points against
 * it. Benchtag ships no map data; the outline is always the user's own entry.
 *
 * Pure geometry: each line is read as flow against pressure ratio, straight between its points,
 * never beyond its first and last point. Left of the surge line → surge warning; right of the
 * choke line → choke warning.
 */
import { CalcInputError, requireObject } from "./errors";
import { INPUT_RULES } from "./input-rules";
import { interpolateLinear } from "./interpolate";
import { formatNumber, relabel, requireChoice, requireQuantity, withUnit } from "./quantity";
import { checkFlowReference, type FlowReference } from "./engine-airflow";
import type { CompressorOperatingPoints } from "./compressor-points";

export const MAP_FLOW_UNITS = ["lb/min", "kg/s"] as const;
export type MapFlowUnit = (typeof MAP_FLOW_UNITS)[number];

/** One point read off the map. */
export interface CompressorMapPoint {
  /** Corrected air flow in the outline's `flowUnit`. */
  correctedFlow: number;
  /** Pressure ratio, outlet over inlet (absolute), 1–8. */
  pressureRatio: number;
}

/** The outline as entered from the maker's sheet. */
export interface CompressorMapOutline {
  /** Unit of the map's flow axis. */
  flowUnit: MapFlowUnit;
  /** Reference conditions printed on the sheet; when given, operating points must use the same. */
  reference?: FlowReference | null;
  /** Surge line, 2–50 points, any order, each pressure ratio once. */
  surgeLine: readonly CompressorMapPoint[];
  /** Choke points (right-hand ends of the speed lines), 2–50 points, each pressure ratio once. */
  chokeLine: readonly CompressorMapPoint[];
}

/** An outline that passed {@link checkCompressorMapOutline}: lines sorted by pressure ratio. */
export interface CheckedMapOutline {
  flowUnit: MapFlowUnit;
  reference: FlowReference | null;
  surgeLine: CompressorMapPoint[];
  chokeLine: CompressorMapPoint[];
}

export const MAX_MAP_LINE_POINTS = 50;

function checkLine(line: unknown, name: "Surge line" | "Choke line", field: string, unit: MapFlowUnit): CompressorMapPoint[] {
  if (!Array.isArray(line) || line.length < 2 || line.length > MAX_MAP_LINE_POINTS) {
    const n = Array.isArray(line) ? line.length : 0;
    throw new CalcInputError(name, line, `must have from 2 to ${MAX_MAP_LINE_POINTS} points read off the map`, {
      shown: `${n} point${n === 1 ? "" : "s"}.`,
      field,
    });
  }
  const flowRule = unit === "lb/min" ? INPUT_RULES.mapFlowLbMin : INPUT_RULES.mapFlowKgS;
  const points = line.map((p: unknown, i) => {
    const at = `${field}[${i}]`;
    if (typeof p !== "object" || p === null) {
      throw new CalcInputError(name, p, "must list points of corrected flow and pressure ratio", {
        shown: `something else at point ${i + 1}.`,
        field: at,
      });
    }
    const point = p as Record<string, unknown>;
    return {
      correctedFlow: requireQuantity(
        relabel(flowRule, `${name} point ${i + 1}: corrected air flow`),
        point.correctedFlow,
        `${at}.correctedFlow`,
      ),
      pressureRatio: requireQuantity(
        relabel(INPUT_RULES.pressureRatio, `${name} point ${i + 1}: pressure ratio`),
        point.pressureRatio,
        `${at}.pressureRatio`,
      ),
    };
  });
  points.sort((a, b) => a.pressureRatio - b.pressureRatio);
  for (let i = 1; i < points.length; i++) {
    if (points[i].pressureRatio === points[i - 1].pressureRatio) {
      throw new CalcInputError(name, points[i].pressureRatio, "must give each pressure ratio once (one flow per pressure ratio)", {
        shown: `two points at pressure ratio ${formatNumber(points[i].pressureRatio)}.`,
        field,
      });
    }
  }
  return points;
}

/** Flow of a sorted line at `pressureRatio`, or null outside the line's first and last point. */
function flowOn(line: readonly CompressorMapPoint[], pressureRatio: number): number | null {
  return interpolateLinear(
    line.map((p) => p.pressureRatio),
    line.map((p) => p.correctedFlow),
    pressureRatio,
  );
}

/**
 * Checks an outline and returns it with each line sorted by pressure ratio. Refuses (in workshop
 * words) a line with fewer than 2 or more than 50 points, a flow or pressure ratio out of range,
 * two points at one pressure ratio, and a surge line that lies on or right of the choke line at any
 * point where both are drawn.
 */
export function checkCompressorMapOutline(outline: CompressorMapOutline): CheckedMapOutline {
  requireObject("outline", outline);
  const flowUnit = requireChoice("Flow unit of the map", outline.flowUnit, MAP_FLOW_UNITS, "flowUnit");
  const reference = outline.reference == null ? null : checkFlowReference(outline.reference);
  const surgeLine = checkLine(outline.surgeLine, "Surge line", "surgeLine", flowUnit);
  const chokeLine = checkLine(outline.chokeLine, "Choke line", "chokeLine", flowUnit);
  for (const pr of [...surgeLine, ...chokeLine].map((p) => p.pressureRatio)) {
    const surge = flowOn(surgeLine, pr);
    const choke = flowOn(chokeLine, pr);
    if (surge !== null && choke !== null && !(surge < choke)) {
      throw new CalcInputError(
        "Surge line",
        surge,
        `must lie left of the choke line (less flow) at every pressure ratio; at pressure ratio ${formatNumber(round(pr, 3))} the choke line is at ${withUnit(round(choke, 3), flowUnit)}`,
        { shown: `${withUnit(round(surge, 3), flowUnit)} there. Check the points.`, field: "surgeLine" },
      );
    }
  }
  return { flowUnit, reference, surgeLine, chokeLine };
}

export type CompressorPointStatus = "inside" | "surge" | "choke" | "above-outline" | "below-outline";

export interface CompressorPointCheck {
  /**
   * "surge": left of the surge line; "choke": right of the choke line; "inside": between them;
   * "above-outline" / "below-outline": pressure ratio higher / lower than every entered point.
   */
  status: CompressorPointStatus;
  correctedFlow: number;
  pressureRatio: number;
  /** Surge-line flow at this pressure ratio, or null where the line is not drawn. */
  surgeFlow: number | null;
  /** Choke-line flow at this pressure ratio, or null where the line is not drawn. */
  chokeFlow: number | null;
  /** (flow − surge flow) / surge flow: how far right of the surge line (negative: left of it). */
  surgeMargin: number | null;
  /** (choke flow − flow) / choke flow: how far left of the choke line (negative: right of it). */
  chokeMargin: number | null;
  /** The finding in workshop words. */
  message: string;
}

function round(x: number, digits: number): number {
  return Number(x.toFixed(digits));
}

function flowDigits(unit: MapFlowUnit): number {
  return unit === "lb/min" ? 1 : 3;
}

/**
 * Where one point (corrected flow in the outline's unit, pressure ratio) falls on the outline.
 * Status order: above/below the outline's pressure-ratio span first, then surge, then choke.
 */
export function checkCompressorPoint(outline: CompressorMapOutline, point: CompressorMapPoint): CompressorPointCheck {
  const map = checkCompressorMapOutline(outline);
  requireObject("point", point);
  const flowRule = map.flowUnit === "lb/min" ? INPUT_RULES.mapFlowLbMin : INPUT_RULES.mapFlowKgS;
  const flow = requireQuantity(flowRule, point.correctedFlow, "correctedFlow");
  const pr = requireQuantity(INPUT_RULES.pressureRatio, point.pressureRatio, "pressureRatio");
  return classify(map, flow, pr);
}

function classify(map: CheckedMapOutline, flow: number, pr: number): CompressorPointCheck {
  const unit = map.flowUnit;
  const fd = flowDigits(unit);
  const all = [...map.surgeLine, ...map.chokeLine].map((p) => p.pressureRatio);
  const lowest = Math.min(...all);
  const highest = Math.max(...all);
  const surgeFlow = flowOn(map.surgeLine, pr);
  const chokeFlow = flowOn(map.chokeLine, pr);
  const surgeMargin = surgeFlow === null ? null : (flow - surgeFlow) / surgeFlow;
  const chokeMargin = chokeFlow === null ? null : (chokeFlow - flow) / chokeFlow;
  const where = `${withUnit(round(flow, fd), unit)} at pressure ratio ${formatNumber(round(pr, 2))}`;
  const base = { correctedFlow: flow, pressureRatio: pr, surgeFlow, chokeFlow, surgeMargin, chokeMargin };

  if (pr > highest) {
    return {
      ...base,
      status: "above-outline",
      message: `${where} is above the highest point entered (pressure ratio ${formatNumber(round(highest, 2))}): off the map, the compressor may overspeed.`,
    };
  }
  if (pr < lowest) {
    return {
      ...base,
      status: "below-outline",
      message: `${where} is below the lowest point entered (pressure ratio ${formatNumber(round(lowest, 2))}): not checked.`,
    };
  }
  if (surgeFlow !== null && flow < surgeFlow) {
    return {
      ...base,
      status: "surge",
      message: `${where} is left of the surge line (${withUnit(round(surgeFlow, fd), unit)} there): surge warning.`,
    };
  }
  if (chokeFlow !== null && flow > chokeFlow) {
    return {
      ...base,
      status: "choke",
      message: `${where} is right of the choke line (${withUnit(round(chokeFlow, fd), unit)} there): choke warning, the compressor is past its flow.`,
    };
  }
  const margins = [
    surgeMargin === null ? "surge line not drawn at this pressure ratio" : `${formatNumber(round(surgeMargin * 100, 0))} % right of surge`,
    chokeMargin === null ? "choke line not drawn at this pressure ratio" : `${formatNumber(round(chokeMargin * 100, 0))} % left of choke`,
  ];
  return { ...base, status: "inside", message: `${where} is inside the outline (${margins.join(", ")}).` };
}

/**
 * Checks every operating point of {@link compressorOperatingPoints} against the outline, using the
 * flow in the outline's unit. When the outline states its reference, the points must have been
 * corrected to the same reference (else the flows are not comparable and this throws).
 * Each message starts with the engine speed, e.g. "At 9 000 rpm: 21.3 lb/min at pressure ratio 2.1 is …".
 */
export function checkOperatingPoints(
  outline: CompressorMapOutline,
  operating: CompressorOperatingPoints,
): Array<CompressorPointCheck & { rpm: number }> {
  const map = checkCompressorMapOutline(outline);
  requireObject("operating", operating);
  if (map.reference !== null) {
    const a = map.reference;
    const b = operating.reference;
    if (Math.abs(a.pressureKpa - b.pressureKpa) > 1e-9 || Math.abs(a.temperatureK - b.temperatureK) > 1e-9) {
      throw new CalcInputError(
        "Map reference",
        a,
        `must match the reference the operating points are corrected to (${withUnit(b.pressureKpa, "kPa")}, ${withUnit(b.temperatureK, "K")})`,
        { shown: `${withUnit(a.pressureKpa, "kPa")}, ${withUnit(a.temperatureK, "K")}.`, field: "reference" },
      );
    }
  }
  return operating.points.map((p) => {
    const flow = map.flowUnit === "lb/min" ? p.correctedFlowLbMin : p.correctedFlowKgS;
    const check = classify(map, flow, p.pressureRatio);
    return { ...check, rpm: p.rpm, message: `At ${withUnit(p.rpm, "rpm")}: ${check.message}` };
  });
}
