import type { WorkOrderStatus } from "../work-orders/status";

// When extra work may be written and the final bill issued, and how long an e-mailed answer link lives.

/** Extra work is found and quoted while the bike is being built (bench, review, dyno). */
export const EXTRA_WORK_STATUSES = ["in_build", "in_review", "on_dyno"] as const satisfies readonly WorkOrderStatus[];
/** The office issues the bill once the approved work is under way or done; handover issues it if nobody did. */
export const BILL_STATUSES = ["in_build", "in_review", "on_dyno", "ready", "handed_over"] as const satisfies readonly WorkOrderStatus[];
/** An e-mailed answer link works this long, once. */
export const ANSWER_LINK_DAYS = 14;

export const mayWriteExtraWork = (s: WorkOrderStatus) => (EXTRA_WORK_STATUSES as readonly WorkOrderStatus[]).includes(s);
export const mayIssueBill = (s: WorkOrderStatus) => (BILL_STATUSES as readonly WorkOrderStatus[]).includes(s);
