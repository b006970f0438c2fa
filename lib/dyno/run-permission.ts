/**
 * Who may record a dyno run on a work order: the office and supervisors of the shop, and the
 * job's mechanic (the bench's own rule, lib/sync/merge-rules.ts `mayWorkOn`: the mechanic it is
 * assigned to, or any mechanic while nobody is). Pure.
 */
import type { Role } from "@/lib/auth/roles";
import { mayWorkOn } from "@/lib/sync/merge-rules";

export function mayRecordRun(
  actor: { id: string; shopId: string; role: Role },
  job: { shopId: string; assignedMechanicId: string | null },
) {
  if (actor.shopId !== job.shopId) return false;
  return actor.role === "office" || mayWorkOn(actor, job);
}

export const NOT_YOUR_RUN = "Only the job's mechanic, a supervisor or the office may record a dyno run on this work order.";
