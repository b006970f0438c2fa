/**
 * Whether a step is done. A step the supervisor sent back is open again until it is completed
 * after the send-back (a redo); a completion waiting on this tablet counts as that redo. A
 * withdrawn completion does not count: the step is to do again.
 */
import type { PendingWork } from "./pending";
import type { Snapshot, StepView, WithdrawalView } from "./types";

const bySeqDesc = (a: { seq: string }, b: { seq: string }) => (BigInt(a.seq) < BigInt(b.seq) ? 1 : -1);

export function stepCompletion(
  snapshot: Snapshot,
  stepId: string,
  work: PendingWork,
  withdrawn: ReadonlyMap<string, WithdrawalView>,
): Pick<StepView, "done" | "donePending" | "reopened" | "flagged" | "completions"> {
  const serverCompletions = snapshot.state.completions.filter((c) => c.stepId === stepId && !withdrawn.has(c.id));
  const pendingCompletions = work.ofKind("step.completed").filter((o) => o.payload.stepId === stepId && !withdrawn.has(o.id));
  const pendingCompletion = pendingCompletions.length > 0;
  const reopenedBy = snapshot.state.reviewDecisions
    .filter((d) => d.decision === "sent_back" && d.reopenedStepIds.includes(stepId))
    .sort(bySeqDesc)[0];
  const standing = reopenedBy ? serverCompletions.filter((c) => BigInt(c.seq) > BigInt(reopenedBy.seq)) : serverCompletions;
  const completedAfterReopen = reopenedBy ? pendingCompletion || standing.length > 0 : false;
  const everDone = pendingCompletion || serverCompletions.length > 0;
  return {
    done: reopenedBy ? completedAfterReopen : everDone,
    donePending: pendingCompletion,
    completions: [
      ...standing.map((c) => ({ operationId: c.id, by: c.completedBy, at: c.deviceTime, pending: false })),
      ...pendingCompletions.map((o) => ({ operationId: o.id, by: o.authorId, at: o.deviceTime, pending: true })),
    ],
    reopened: reopenedBy && !completedAfterReopen ? { reason: reopenedBy.reason, decidedAt: reopenedBy.decidedAt } : null,
    flagged: serverCompletions.find((c) => c.flagged)?.flagReason ?? null,
  };
}
