/**
 * The rules a decision on a sign-off must pass, as a pure function. db/review/decide.ts loads the
 * facts under the shop's sync lock and calls `checkDecision`; a refusal is answered with its
 * status and reason (and written to the audit log), nothing else is saved.
 */
import { canReach, type Role } from "@/lib/auth/roles";
import type { DecisionInput } from "./decision-input";

export interface DecisionFacts {
  actor: { id: string; role: Role };
  /** `withdrawn`: taken back by its author or a supervisor (the stage waits for a new sign-off). */
  signOff: { id: string; signedBy: string; stageTitle: string; withdrawn?: boolean };
  job: { number: number; closed: boolean };
  /** The newest sign-off of the same stage. */
  latestSignOffId: string;
  /** The decision standing on this sign-off now, if any. */
  latestDecisionId: string | null;
  stageSteps: ReadonlyArray<{ id: string; title: string }>;
  /** Current readings of the stage's steps that are out of tolerance. */
  outOfTolerance: ReadonlyArray<{ readingId: string; description: string; accepted: boolean; recordedBy?: string }>;
  /** Flagged entries of the stage (and those on no stage of the job), with whether each is accepted, and who recorded each. */
  flagged: ReadonlyArray<{ operationId: string; description: string; accepted: boolean; authorId?: string }>;
  /** Work on the stage received after the record the supervisor's screen showed (`seenUpTo`), described. */
  arrivedSinceSeen?: ReadonlyArray<string>;
}

export type DecisionCheck =
  | { ok: true; reopenStepIds: string[] }
  | { ok: false; status: 403 | 409 | 422; reason: string; issues: Array<{ path: string; message: string }> };

const refuse = (status: 403 | 409 | 422, reason: string, issues: Array<{ path: string; message: string }> = []): DecisionCheck => ({
  ok: false,
  status,
  reason,
  issues,
});

export function checkDecision(f: DecisionFacts, input: DecisionInput): DecisionCheck {
  if (!canReach(f.actor.role, "decide")) return refuse(403, `Your role (${f.actor.role}) may not approve or send back work.`);
  if (f.signOff.signedBy === f.actor.id) {
    return refuse(403, "You signed this stage off yourself: another supervisor or the office must review it.");
  }
  if (f.signOff.withdrawn) {
    return refuse(409, `This sign-off of "${f.signOff.stageTitle}" was withdrawn: the stage waits for a new sign-off to review.`);
  }
  if (f.latestSignOffId !== f.signOff.id) {
    return refuse(409, `"${f.signOff.stageTitle}" has been signed off again since; review the newest sign-off instead.`);
  }
  if (f.latestDecisionId !== input.expectedDecisionId) {
    return refuse(409, "Someone else decided on this sign-off while you were looking at it. Reload to see their decision.");
  }
  const unseen = f.arrivedSinceSeen ?? [];
  if (unseen.length) {
    const what =
      unseen.length === 1
        ? `1 new entry (${unseen[0]})`
        : `${unseen.length} new entries (${unseen.slice(0, 3).join("; ")}${unseen.length > 3 ? "; …" : ""})`;
    const message = `While you had this review open, ${what} arrived on "${f.signOff.stageTitle}". Reload to see ${unseen.length === 1 ? "it" : "them"} before you decide.`;
    // named "seenUpTo": the review screen offers to reload the record, keeping what was typed
    return refuse(409, message, [{ path: "seenUpTo", message }]);
  }
  if (f.job.closed && input.decision === "sent_back") {
    return refuse(409, `Work order #${f.job.number} is closed: nothing on it can be reopened.`);
  }

  const issues: Array<{ path: string; message: string }> = [];
  const oot = new Map(f.outOfTolerance.map((o) => [o.readingId, o]));
  const acceptedNow = new Set<string>();
  input.acceptances.forEach((a, i) => {
    const o = oot.get(a.readingId);
    if (!o)
      issues.push({ path: `acceptances.${i}.readingId`, message: "This reading is not a current out-of-tolerance reading of this stage." });
    else if (o.accepted) issues.push({ path: `acceptances.${i}.readingId`, message: `${o.description} was already accepted.` });
    else if (acceptedNow.has(a.readingId))
      issues.push({ path: `acceptances.${i}.readingId`, message: `${o.description} is listed twice.` });
    else if (o.recordedBy === f.actor.id)
      issues.push({
        path: `acceptances.${i}.readingId`,
        message: `You recorded ${o.description} yourself: another supervisor or the office must let it stand.`,
      });
    acceptedNow.add(a.readingId);
  });

  const flagged = new Map(f.flagged.map((x) => [x.operationId, x]));
  const flagAcceptedNow = new Set<string>();
  input.flagAcceptances.forEach((a, i) => {
    const x = flagged.get(a.operationId);
    if (!x) issues.push({ path: `flagAcceptances.${i}.operationId`, message: "This is not a flagged entry of this stage." });
    else if (x.accepted) issues.push({ path: `flagAcceptances.${i}.operationId`, message: `${x.description} was already accepted.` });
    else if (flagAcceptedNow.has(a.operationId))
      issues.push({ path: `flagAcceptances.${i}.operationId`, message: `${x.description} is listed twice.` });
    else if (x.authorId === f.actor.id)
      issues.push({
        path: `flagAcceptances.${i}.operationId`,
        message: `You recorded ${x.description} yourself: another supervisor or the office must accept it.`,
      });
    flagAcceptedNow.add(a.operationId);
  });

  let reopenStepIds: string[] = [];
  if (input.decision === "approved") {
    for (const o of f.outOfTolerance) {
      if (!o.accepted && !acceptedNow.has(o.readingId)) {
        issues.push({
          path: `reading.${o.readingId}`,
          message: `${o.description} is out of tolerance: accept it with a written reason, or send the step back.`,
        });
      }
    }
    for (const x of f.flagged) {
      if (!x.accepted && !flagAcceptedNow.has(x.operationId)) {
        issues.push({
          path: `flagged.${x.operationId}`,
          message: `${x.description} was flagged: accept it with a written reason, or send the step back.`,
        });
      }
    }
  } else {
    const inStage = new Set(f.stageSteps.map((s) => s.id));
    input.reopenStepIds.forEach((id, i) => {
      if (!inStage.has(id)) issues.push({ path: `reopenStepIds.${i}`, message: "This step is not part of the signed-off stage." });
    });
    reopenStepIds = [...new Set(input.reopenStepIds)];
  }
  if (issues.length) {
    const reason =
      input.decision === "approved" ? "Not approved: see the marked readings and entries." : "Not sent back: see the marked fields.";
    return refuse(422, issues.length === 1 ? issues[0].message : reason, issues);
  }
  return { ok: true, reopenStepIds };
}
