import type { FieldIssue } from "@/lib/errors";
import { openItemLine, openItemsSummary, sameOpenItems, type OpenItem } from "./open-items";
import { canTransition, STATUS_LABELS, type WorkOrderStatus } from "./status";

/**
 * The moves that are gated on the record: nothing open (lib/work-orders/open-items.ts) unless the
 * office overrides with a written reason. Every other move has only the rules below.
 */
export const GATED_MOVES = ["ready", "handed_over"] as const satisfies readonly WorkOrderStatus[];

export function isGatedMove(to: WorkOrderStatus): boolean {
  return (GATED_MOVES as readonly WorkOrderStatus[]).includes(to);
}

/** The office's override of the gate: a written reason, and the open items it saw (their keys). */
export interface OverrideRequest {
  reason: string;
  openItemKeys: readonly string[];
}

// What the office must have done before a work order may move on. Pure: the caller gathers the facts.
export interface TransitionFacts {
  sentQuote: boolean; // a quote has been sent to the customer
  approvedQuote: boolean; // the customer approved the current quote
  depositDueMinor: number; // the approved quote's deposit (0 = none asked)
  depositPaidMinor: number; // sum of paid deposits on that quote
  mechanicAssigned: boolean;
  proceduresPinned: number; // already pinned plus those pinned with this move
  byCustomerApproval?: boolean; // the move is the customer's own approval
  /** What is still open on the record (needed for the gated moves; see GATED_MOVES). */
  openItems?: readonly OpenItem[];
  /** The office's override with a reason, when given. */
  override?: OverrideRequest | null;
}

type TransitionCheck = { ok: true; overridden?: true } | { ok: false; reason: string; issues?: FieldIssue[]; openItems?: true };

export function checkTransition(from: WorkOrderStatus, to: WorkOrderStatus, f: TransitionFacts): TransitionCheck {
  if (from === to) return { ok: false, reason: `The work order is already "${STATUS_LABELS[to]}".` };
  if (!canTransition(from, to)) {
    return { ok: false, reason: `A work order cannot go from "${STATUS_LABELS[from]}" to "${STATUS_LABELS[to]}".` };
  }
  if (f.override && !isGatedMove(to)) {
    return {
      ok: false,
      reason: `Only the moves to "${STATUS_LABELS.ready}" and "${STATUS_LABELS.handed_over}" can be made with open items; move to "${STATUS_LABELS[to]}" without an override.`,
      issues: [{ path: "override", message: "Override: only for the moves to Ready and Handed over." }],
    };
  }
  if (to === "quoted" && !f.sentQuote) return { ok: false, reason: "Send a quote to the customer first." };
  if (to === "approved") {
    if (!f.byCustomerApproval) return { ok: false, reason: "Only the customer can approve the quote, from their own sign-in." };
    if (!f.sentQuote) return { ok: false, reason: "There is no quote waiting for approval." };
  }
  if (to === "in_build") {
    if (from === "approved") {
      if (!f.approvedQuote) return { ok: false, reason: "The quote has not been approved." };
      if (f.depositPaidMinor < f.depositDueMinor) return { ok: false, reason: "The deposit has not been paid yet." };
    }
    if (!f.mechanicAssigned) return { ok: false, reason: "Assign a mechanic before the job goes in build." };
    if (f.proceduresPinned < 1) return { ok: false, reason: "Pin at least one procedure template before the job goes in build." };
  }
  if (isGatedMove(to)) return checkGate(to, f.openItems, f.override ?? null);
  return { ok: true };
}

/** The gate on "ready" and "handed over": nothing open, or the office's override naming the open items it saw. */
function checkGate(to: WorkOrderStatus, open: readonly OpenItem[] | undefined, override: OverrideRequest | null): TransitionCheck {
  if (open === undefined) return { ok: false, reason: "The record's open items could not be checked; nothing was changed." };
  const target = STATUS_LABELS[to];
  if (open.length === 0) {
    if (override) {
      return {
        ok: false,
        reason: `Nothing is open on the record any more: move the job to "${target}" without an override.`,
        issues: [{ path: "override", message: "Override: nothing is open, so there is nothing to override." }],
      };
    }
    return { ok: true };
  }
  if (!override) {
    return {
      ok: false,
      reason: `The job cannot move to "${target}" while items are still open (${openItemsSummary(open)}). Settle them, or hand over with a written reason.`,
      issues: open.map((i) => ({ path: "openItems", message: openItemLine(i) })),
      openItems: true,
    };
  }
  if (!sameOpenItems(open, override.openItemKeys)) {
    return {
      ok: false,
      reason: "The list of open items changed since you looked at it: read it again, then write the reason again.",
      issues: [{ path: "override.openItemKeys", message: "Open items: the list on your screen is not the list on record now." }],
      openItems: true,
    };
  }
  return { ok: true, overridden: true };
}
