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

/**
 * Whether the page of an e-mailed extra-work link shows the finding, its prices and the answers
 * given. The link is the only check for a visitor who is not signed in, so it shows them only until
 * the link's own end (used or not): a forwarded or leaked link stops showing the customer's job
 * after that. The customer signed in as its owner always sees them (their page shows them too);
 * another customer never does; staff do (the office sees the job anyway).
 */
export function extraWorkLinkShowsDetails(
  link: { kind: "unknown" } | { kind: "open" | "used" | "expired"; customerId: string; expiresAt: Date },
  visitor: { signedIn: boolean; customerId: string | null },
  now: Date = new Date(),
): boolean {
  if (link.kind === "unknown") return false;
  if (visitor.customerId) return visitor.customerId === link.customerId;
  if (visitor.signedIn) return true;
  return link.expiresAt.getTime() > now.getTime();
}
