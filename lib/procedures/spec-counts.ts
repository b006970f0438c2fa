import { torqueStages, type TorqueSpec } from "../calc/torque-stages";

// How much work a spec asks for, written once: the server's merge checks a reading index or a
// torque pass against these, the tablet and the review screen lay out the same spots and passes,
// and the build report counts against them. If they ever differed, the tablet would offer a
// reading or a pass the server refuses.

/** Readings a measurement spec expects: one per reading label, and one when it has none. */
export function expectedReadings(readingLabels: readonly string[]): number {
  return Math.max(1, readingLabels.length);
}

/**
 * Passes a torque spec is tightened in, bolt by bolt: its torque passes (one at the final value
 * when none are listed) and then its angle passes — exactly the passes `torqueStages` lays out for
 * the tablet, because it is their count.
 */
export function torquePassCount(spec: TorqueSpec): number {
  return torqueStages(spec).length;
}
