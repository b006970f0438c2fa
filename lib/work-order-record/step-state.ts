/**
 * Whether a step is done. A step the supervisor sent back is open again until it is completed
 * after the send-back (a redo); a completion waiting on this tablet counts as that redo.
 */
import type { PendingWork } from "./pending";
import type { Snapshot, StepView } from "./types";

const bySeqDesc = (a: { seq: string }, b: { seq: string }) => (BigInt(a.seq) < BigInt(b.seq) ? 1 : -1);

export function stepCompletion(
  snapshot: Snapshot,
  stepId: string,
  work: PendingWork,
): Pick<StepView, "done" | "donePending" | "reopened" | "flagged"> {
  const serverCompletions = snapshot.state.completions.filter((c) => c.stepId === stepId);
  const pendingCompletion = work.ofKind("step.completed").some((o) => o.payload.stepId === stepId);
  const reopenedBy = snapshot.state.reviewDecisions
    .filter((d) => d.decision === "sent_back" && d.reopenedStepIds.includes(stepId))
    .sort(bySeqDesc)[0];
  const completedAfterReopen = reopenedBy
    ? pendingCompletion || serverCompletions.some((c) => BigInt(c.seq) > BigInt(reopenedBy.seq))
    : false;
  const everDone = pendingCompletion || serverCompletions.length > 0;
  return {
    done: reopenedBy ? completedAfterReopen : everDone,
    donePending: pendingCompletion,
    reopened: reopenedBy && !completedAfterReopen ? { reason: reopenedBy.reason, decidedAt: reopenedBy.decidedAt } : null,
    flagged: serverCompletions.find((c) => c.flagged)?.flagReason ?? null,
  };
}
