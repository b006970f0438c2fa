/**
 * The "intake volume about ten times displacement" rule of thumb for a turbo conversion.
 */
import { INPUT_RULES } from "./input-rules";
import { requireQuantity } from "./quantity";

/** Multiple of displacement the rule of thumb asks for (common practice). */
export const INTAKE_VOLUME_MULTIPLE = 10;

/**
 * Rule-of-thumb volume for the intake side before the compressor (airbox or filter housing and
 * the inlet pipe up to the compressor): about ten times the engine's displacement, in cc.
 * Common practice only; it is not about the charge side after the compressor (intercooler,
 * piping, plenum) and no standard or maker's figure stands behind it.
 */
export function intakeVolumeGuideCc(displacementCc: number): { volumeCc: number; basis: string; caution: string } {
  const vd = requireQuantity(INPUT_RULES.displacement, displacementCc, "displacementCc");
  return {
    volumeCc: INTAKE_VOLUME_MULTIPLE * vd,
    basis:
      "Common practice: the intake side before the compressor (airbox or filter housing and the inlet pipe to the compressor) holds about ten times the engine's displacement.",
    caution: "A rule of thumb, not a specification; it says nothing about the charge side after the compressor.",
  };
}
