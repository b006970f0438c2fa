/**
 * Withdrawing a dyno run recorded by mistake (wrong file, a pull with the wheel spinning, wrong
 * weather figures). Our rule: a run is never deleted or edited; it is withdrawn with a written
 * reason, stays on record with who and when, and no longer counts in the plot or the build report.
 * A corrected run is recorded as a new run. Pure.
 */
import { z } from "zod";

export interface DynoRunWithdrawal {
  at: string;
  byName: string | null;
  reason: string;
}

export const runWithdrawalSchema = z
  .object({
    reason: z
      .string({ error: "Say why the run is withdrawn." })
      .trim()
      .min(5, "Say why the run is withdrawn (at least 5 characters).")
      .max(500, "Keep the reason under 500 characters."),
  })
  .strict();
export type RunWithdrawalInput = z.infer<typeof runWithdrawalSchema>;

/** Runs that still count: not withdrawn. */
export function countingRuns<T extends { withdrawn: DynoRunWithdrawal | null }>(runs: readonly T[]): T[] {
  return runs.filter((r) => r.withdrawn === null);
}
