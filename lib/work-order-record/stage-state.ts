/**
 * A stage's sign-off and the supervisor's decision on it. A sign-off stands unless the latest
 * decision sent the stage back after it, or it was withdrawn; then the stage needs a new sign-off.
 */
import type { PendingWork } from "./pending";
import type { Snapshot, StageView, WithdrawalView } from "./types";

type Decision = Snapshot["state"]["reviewDecisions"][number];

const stageKey = (jobProcedureId: string, key: string) => `${jobProcedureId}|${key}`;

/** The latest decision (by sequence) on each stage, keyed "jobProcedureId|stageKey". */
export function latestDecisions(snapshot: Snapshot): Map<string, Decision> {
  const latest = new Map<string, Decision>();
  for (const d of snapshot.state.reviewDecisions) {
    const key = stageKey(d.jobProcedureId, d.stageKey);
    const held = latest.get(key);
    if (!held || BigInt(d.seq) > BigInt(held.seq)) latest.set(key, d);
  }
  return latest;
}

export function decisionOn(decisions: ReadonlyMap<string, Decision>, jobProcedureId: string, key: string): Decision | null {
  return decisions.get(stageKey(jobProcedureId, key)) ?? null;
}

/**
 * The decision that speaks for a stage: the one on its standing sign-off when that sign-off is on
 * record (a later sign-off that nobody has decided on yet has none, even when an earlier one was
 * approved); otherwise the latest decision on the stage (a send-back waiting for the redo).
 */
export function decisionInForce(decision: Decision | null, signedOff: StageView["signedOff"]): Decision | null {
  if (!decision || !signedOff || signedOff.pending) return decision;
  return decision.signOffId === signedOff.id ? decision : null;
}

/**
 * The sign-off that stands for a stage: one waiting on this tablet, else the latest on record unless a later send-back undid it;
 * withdrawn sign-offs are left out.
 */
export function standingSignOff(
  snapshot: Snapshot,
  jobProcedureId: string,
  key: string,
  decision: Decision | null,
  work: PendingWork,
  withdrawn: ReadonlyMap<string, WithdrawalView>,
): StageView["signedOff"] {
  const pending = work
    .ofKind("stage.signed-off")
    .filter((o) => o.payload.jobProcedureId === jobProcedureId && o.payload.stageKey === key && !withdrawn.has(o.id))
    .at(-1);
  if (pending) return { at: pending.deviceTime, pending: true, id: pending.id, by: pending.authorId };
  const latest = snapshot.state.signOffs
    .filter((s) => s.jobProcedureId === jobProcedureId && s.stageKey === key && !withdrawn.has(s.id))
    .sort((a, b) => (BigInt(a.seq) < BigInt(b.seq) ? 1 : -1))[0];
  if (!latest) return null;
  const stands =
    !decision ||
    BigInt(latest.seq) > BigInt(decision.seq) ||
    (decision.decision === "approved" && (decision.signOffId === latest.id || !withdrawn.has(decision.signOffId)));
  return stands ? { at: latest.deviceTime, pending: false, id: latest.id, by: latest.signedBy } : null;
}
