/**
 * Is a value typed at the bench one the spec can physically be? Three answers:
 *  - refuse: beyond anything on an engine (the wire format refuses it too, with the same words:
 *    lib/sync/reading-value.ts, WRENCH_READING_LIMIT in lib/sync/operations.ts);
 *  - confirm: possible but unlikely — a length below zero, a reading far outside the limits, a
 *    wrench reading far from the pass's target. The bench asks the mechanic to confirm with a
 *    clear second tap before saving (a slipped finger, a decimal point in the wrong place);
 *  - ok.
 * Pure; shared rules are written once here.
 */
import { convertTorque, type MeasurementUnit, type TorqueUnit } from "@/lib/calc/units";
import { beyondWrenchLimit } from "@/lib/sync/operations";
import { readingValueProblem } from "@/lib/sync/reading-value";

export type Plausibility = { kind: "ok" } | { kind: "refuse"; reason: string } | { kind: "confirm"; reasons: string[] };

/** How many widths of the tolerance band outside a limit counts as "far": a misplaced digit, not a worn part. */
export const FAR_BANDS = 5;
/** A wrench reading this many times the pass target (or less than its inverse) is questioned. */
export const WRENCH_FAR_FACTOR = 1.5;

const ok: Plausibility = { kind: "ok" };

export interface SpecLimits {
  unit: MeasurementUnit;
  min: number;
  max: number;
  nominal: number | null;
}

/** A reading's decimal text (as typed, in the spec's unit) against its spec. */
export function readingPlausibility(text: string, spec: SpecLimits): Plausibility {
  const problem = readingValueProblem(text, spec.unit);
  if (problem) return { kind: "refuse", reason: problem };
  const v = Number(text);
  const reasons: string[] = [];
  const limits = `${spec.min} to ${spec.max} ${spec.unit}`;
  if (v < 0 && spec.min >= 0) reasons.push(`${text} ${spec.unit} is below zero: a bore, a gap or a clearance cannot be negative.`);
  else if (v === 0 && spec.min > 0) reasons.push(`A reading of zero: did the instrument read at all? The spec is ${limits}.`);
  const band = spec.max - spec.min > 0 ? spec.max - spec.min : Math.abs(spec.nominal ?? spec.max) * 0.1 || 0.001;
  if (v >= 0 && v < spec.min - FAR_BANDS * band && !(v === 0 && spec.min > 0)) {
    reasons.push(`${text} ${spec.unit} is far below the limits (${limits}): check the decimal point and the instrument.`);
  }
  if (v > spec.max + FAR_BANDS * band) {
    reasons.push(`${text} ${spec.unit} is far above the limits (${limits}): check the decimal point and the instrument.`);
  }
  return reasons.length ? { kind: "confirm", reasons } : ok;
}

/**
 * A wrench reading against the pass's target torque (null for an angle pass, which has no torque
 * target). Given as typed ("31.50"), it is named as typed in the question.
 */
export function wrenchPlausibility(
  reading: number | string,
  unit: TorqueUnit,
  target: { value: number; unit: TorqueUnit } | null,
): Plausibility {
  const value = Number(reading);
  if (!Number.isFinite(value) || value <= 0) return { kind: "refuse", reason: "Wrench reading must be above zero." };
  const beyond = beyondWrenchLimit("Wrench reading", reading, unit);
  if (beyond) return { kind: "refuse", reason: `${beyond}; check the wrench and type it again.` };
  if (!target) return ok;
  const aim = convertTorque(target.value, target.unit, unit);
  const shown = `${Number.parseFloat(aim.toPrecision(4))} ${unit}`;
  if (value > aim * WRENCH_FAR_FACTOR) {
    return {
      kind: "confirm",
      reasons: [`${reading} ${unit} is far above this pass's target of ${shown}: was the bolt over-tightened, or the reading mistyped?`],
    };
  }
  if (value < aim / WRENCH_FAR_FACTOR) {
    return { kind: "confirm", reasons: [`${reading} ${unit} is well below this pass's target of ${shown}: was the wrench set right?`] };
  }
  return ok;
}
