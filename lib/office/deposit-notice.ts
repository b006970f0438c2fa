/**
 * A paid deposit does not move a work order by itself: the office does, once a mechanic is
 * assigned and procedures are pinned. The office is told instead, on the work order and in the
 * work-order list: the customer approved the quote and paid the deposit it asked for, so the job
 * is ready to go into build. Pure.
 */
import type { WorkOrderStatus } from "@/lib/work-orders/status";

export interface DepositFacts {
  status: WorkOrderStatus;
  /** The approved quote's deposit (null: no approved quote). */
  depositDueMinor: number | null;
  depositPaidMinor: number;
}

export function readyToGoInBuild(f: DepositFacts): boolean {
  return f.status === "approved" && f.depositDueMinor !== null && f.depositDueMinor > 0 && f.depositPaidMinor >= f.depositDueMinor;
}

export const READY_FOR_BUILD_NOTICE =
  "Deposit paid: this job is ready to go into build. Assign a mechanic and pin its procedures, then move it to In build.";
