/**
 * A figure that changes across the rev range (volumetric efficiency, boost), entered either as one
 * number for the whole range or as points against engine speed, read between points in a straight
 * line.
 */
import { CalcInputError } from "./errors";
import { INPUT_RULES } from "./input-rules";
import { interpolateLinear } from "./interpolate";
import { formatNumber, relabel, requireQuantity, withUnit, type QuantityRule } from "./quantity";

/** One point of a curve against engine speed. */
export interface RpmValue {
  /** Engine speed, rpm (1–25 000). */
  rpm: number;
  value: number;
}

/** One number for every engine speed, or points against rpm (any order, each rpm once). */
export type RpmCurveInput = number | readonly RpmValue[];

/** The most points a curve or a rev range may hold. */
export const MAX_CURVE_POINTS = 200;

/**
 * Checks `curve` against `rule` and returns a reader giving its value at an engine speed.
 * The reader throws (in workshop words) for an engine speed outside the curve's points.
 * @param field the input's key (e.g. "volumetricEfficiency") for the error's `field`.
 */
export function readRpmCurve(curve: RpmCurveInput, rule: QuantityRule, field: string): (rpm: number) => number {
  if (typeof curve === "number" || !Array.isArray(curve)) {
    const value = requireQuantity(rule, curve, field);
    return () => value;
  }
  if (curve.length < 1 || curve.length > MAX_CURVE_POINTS) {
    throw new CalcInputError(`${rule.label} curve`, curve.length, `must have from 1 to ${MAX_CURVE_POINTS} points`, {
      shown: `${curve.length} points.`,
      field,
    });
  }
  const points = curve.map((p, i) => {
    const at = `${field}[${i}]`;
    if (typeof p !== "object" || p === null) {
      throw new CalcInputError(`${rule.label} curve`, p, "must list points of engine speed and value", {
        shown: `something else at point ${i + 1}.`,
        field: at,
      });
    }
    const rpm = requireQuantity(
      relabel(INPUT_RULES.engineSpeed, `Engine speed of ${rule.label.toLowerCase()} point ${i + 1}`),
      p.rpm,
      `${at}.rpm`,
    );
    const value = requireQuantity(relabel(rule, `${rule.label} at ${withUnit(rpm, "rpm")}`), p.value, `${at}.value`);
    return { rpm, value };
  });
  points.sort((a, b) => a.rpm - b.rpm);
  for (let i = 1; i < points.length; i++) {
    if (points[i].rpm === points[i - 1].rpm) {
      throw new CalcInputError(`${rule.label} curve`, points[i].rpm, "must give each engine speed once", {
        shown: `${withUnit(points[i].rpm, "rpm")} twice.`,
        field,
      });
    }
  }
  const xs = points.map((p) => p.rpm);
  const ys = points.map((p) => p.value);
  return (rpm: number) => {
    const y = interpolateLinear(xs, ys, rpm);
    if (y === null) {
      const span = xs.length === 1 ? `only ${withUnit(xs[0], "rpm")}` : `${formatNumber(xs[0])} to ${withUnit(xs[xs.length - 1], "rpm")}`;
      throw new CalcInputError("Engine speed", rpm, `must lie within the ${rule.label.toLowerCase()} curve (${span}); add a point there`, {
        shown: `${withUnit(rpm, "rpm")}.`,
        field,
      });
    }
    return y;
  };
}
