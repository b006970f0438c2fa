/**
 * Expansion of a multi-stage tightening spec (torque passes, then angle passes) into an
 * ordered list of passes for the bench screen and the job record.
 */
import { CalcInputError, requireInRange, requireObject, requireOneOf, requirePositive } from "./errors";
import { TORQUE_UNITS, type TorqueUnit } from "./units";

/** One torque pass in a spec: either a percentage of the final value or an absolute value in the spec's unit. */
export type TorquePassSpec = { percent: number } | { value: number };

/**
 * A tightening spec.
 *
 * - `finalValue` — final torque in `unit` (> 0). For torque-angle fastening this is the seating torque
 *   reached before the angle passes.
 * - `passes` — torque passes in order. `{ percent }` is a share of `finalValue` in (0, 100];
 *   `{ value }` is an absolute torque in `unit` in (0, finalValue]. Targets must never decrease
 *   (equal repeats, e.g. a check pass at 100 %, are allowed) and the last pass must reach
 *   `finalValue` (`{ percent: 100 }` or `{ value: finalValue }`). An empty list means one pass at `finalValue`.
 * - `anglePasses` — optional turn-of-nut passes after the last torque pass, each an angle in degrees
 *   in (0, 360], e.g. `[90, 90]`.
 */
export interface TorqueSpec {
  finalValue: number;
  unit: TorqueUnit;
  passes: TorquePassSpec[];
  anglePasses?: number[];
}

/** One expanded pass. `index` counts from 1 across torque and angle passes. */
export type TorquePass =
  | {
      index: number;
      kind: "torque";
      /** Target torque in `unit`. */
      target: number;
      unit: TorqueUnit;
      /** The pass's percentage as written, or value / finalValue × 100 for an absolute pass. */
      percentOfFinal: number;
      /** "30 %" for a percentage pass, "25 N·m" for an absolute pass. */
      label: string;
    }
  | {
      index: number;
      kind: "angle";
      /** Angle to turn, degrees. */
      target: number;
      unit: "°";
      /** e.g. "+90°". */
      label: string;
    };

/**
 * Expands a {@link TorqueSpec} into its ordered passes: torque passes (target in the spec's unit,
 * target = finalValue × percent / 100 for percentage passes), then angle passes (degrees).
 * Throws {@link CalcInputError} for a decreasing sequence, a percentage outside (0, 100],
 * a value outside (0, finalValue], a last pass short of finalValue, or a bad angle.
 */
export function torqueStages(spec: TorqueSpec): TorquePass[] {
  requireObject("spec", spec);
  const finalValue = requirePositive("spec.finalValue", spec.finalValue);
  const unit = requireOneOf("spec.unit", spec.unit, TORQUE_UNITS);
  if (!Array.isArray(spec.passes)) throw new CalcInputError("spec.passes", spec.passes, "must be an array");
  const anglePasses = spec.anglePasses ?? [];
  if (!Array.isArray(anglePasses)) {
    throw new CalcInputError("spec.anglePasses", spec.anglePasses, "must be an array of degrees");
  }

  const out: TorquePass[] = [];
  const passSpecs: TorquePassSpec[] = spec.passes.length === 0 ? [{ percent: 100 }] : spec.passes;
  let previous = 0;
  let reachedFinal = false;
  passSpecs.forEach((pass, i) => {
    const name = `spec.passes[${i}]`;
    requireObject(name, pass);
    const hasPercent = "percent" in pass;
    const hasValue = "value" in pass;
    if (hasPercent === hasValue) {
      throw new CalcInputError(name, pass, "must have exactly one of percent or value");
    }
    let target: number;
    let percentOfFinal: number;
    let label: string;
    if (hasPercent) {
      const percent = requireInRange(`${name}.percent`, pass.percent, 0, 100, { lowOpen: true });
      target = finalValue * (percent / 100);
      percentOfFinal = percent;
      label = `${percent} %`;
      reachedFinal = percent === 100;
    } else {
      const value = requireInRange(`${name}.value`, pass.value, 0, finalValue, { lowOpen: true });
      target = value;
      percentOfFinal = (value / finalValue) * 100;
      label = `${value} ${unit}`;
      reachedFinal = value === finalValue;
    }
    if (target < previous) {
      throw new CalcInputError(name, pass, `must not be below the previous pass (${previous} ${unit})`);
    }
    previous = target;
    out.push({ index: out.length + 1, kind: "torque", target, unit, percentOfFinal, label });
  });
  if (!reachedFinal) {
    throw new CalcInputError("spec.passes", spec.passes, `must end with a pass at the final value (${finalValue} ${unit} / 100 %)`);
  }
  anglePasses.forEach((deg, i) => {
    const angle = requireInRange(`spec.anglePasses[${i}]`, deg, 0, 360, { lowOpen: true });
    out.push({ index: out.length + 1, kind: "angle", target: angle, unit: "°", label: `+${angle}°` });
  });
  return out;
}
