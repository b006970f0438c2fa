import { canTransition, STATUS_LABELS, type WorkOrderStatus } from "./status";

// What the office must have done before a work order may move on. Pure: the caller gathers the facts.
export interface TransitionFacts {
  sentQuote: boolean; // a quote has been sent to the customer
  approvedQuote: boolean; // the customer approved the current quote
  depositDueMinor: number; // the approved quote's deposit (0 = none asked)
  depositPaidMinor: number; // sum of paid deposits on that quote
  mechanicAssigned: boolean;
  proceduresPinned: number; // already pinned plus those pinned with this move
  byCustomerApproval?: boolean; // the move is the customer's own approval
}

type TransitionCheck = { ok: true } | { ok: false; reason: string };

export function checkTransition(from: WorkOrderStatus, to: WorkOrderStatus, f: TransitionFacts): TransitionCheck {
  if (from === to) return { ok: false, reason: `The work order is already "${STATUS_LABELS[to]}".` };
  if (!canTransition(from, to)) {
    return { ok: false, reason: `A work order cannot go from "${STATUS_LABELS[from]}" to "${STATUS_LABELS[to]}".` };
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
  return { ok: true };
}
