import "server-only";
import { sql, type Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import type { DecisionInput } from "@/lib/review/decision-input";
import { checkDecision, type DecisionCheck } from "@/lib/review/decision-rules";
import { isClosed } from "@/lib/work-orders/status";
import { appendAudit } from "../audit/append";
import {
  latestDecisionOn,
  latestSignOffOfStage,
  signOffInShop,
  stageFlaggedEntries,
  stageOutOfTolerance,
  stageSteps,
  stageWorkSince,
} from "./stage";
import type { Database } from "../schema";

type DecideResult =
  | {
      ok: true;
      decisionId: string;
      decision: "approved" | "sent_back";
      reopenedStepIds: string[];
      accepted: number;
      /** The job is closed: an accepted change that the stored build report must follow (a new revision). */
      closedJob: boolean;
      workOrderId: string;
      changeSeq: string;
    }
  | { ok: false; status: 403 | 404 | 409 | 422; reason: string; issues: Array<{ path: string; message: string }> };

/**
 * Records a supervisor's decision on a sign-off, in one transaction under the shop's sync lock (the
 * same lock the merge takes, so the decision's place in the change feed and the facts checked here
 * cannot shift underneath): the decision row (append-only), the written acceptances of
 * out-of-tolerance readings, and the audit entry. A refusal saves nothing but its audit entry.
 * A send-back reaches the mechanic's tablet through the sync change feed (db/sync/changes.ts).
 * With `input.seenUpTo` (the route requires it), work on the stage received after the record the
 * supervisor's screen showed refuses the decision: nothing is approved or sent back unseen.
 */
export async function decideOnSignOff(
  db: Kysely<Database>,
  user: SessionUser,
  signOffId: string,
  input: DecisionInput,
  deviceId: string | null = null,
): Promise<DecideResult> {
  return db.transaction().execute(async (trx) => {
    await sql`SELECT benchtag_lock_shop_sync(${user.shopId}::uuid)`.execute(trx);
    const so = await signOffInShop(trx, user.shopId, signOffId);
    if (!so) return { ok: false, status: 404, reason: "No such sign-off in this shop.", issues: [] };

    const [latestSignOffId, latestDecision, steps, outOfTolerance, flagged, arrivedSinceSeen] = await Promise.all([
      latestSignOffOfStage(trx, so.jobProcedureId, so.stageKey),
      latestDecisionOn(trx, so.id),
      stageSteps(trx, so.templateVersionId, so.stageKey),
      stageOutOfTolerance(trx, so.workOrderId, so.templateVersionId, so.stageKey),
      stageFlaggedEntries(trx, user.shopId, so),
      input.seenUpTo === undefined ? [] : stageWorkSince(trx, so, input.seenUpTo),
    ]);
    const check: DecisionCheck = checkDecision(
      {
        actor: { id: user.id, role: user.role },
        signOff: { id: so.id, signedBy: so.signedBy, stageTitle: so.stageTitle ?? so.stageKey, withdrawn: Boolean(so.withdrawn) },
        job: { number: so.number, closed: isClosed(so.status) },
        latestSignOffId: latestSignOffId ?? so.id,
        latestDecisionId: latestDecision?.id ?? null,
        stageSteps: steps,
        outOfTolerance: outOfTolerance.map((o) => ({
          readingId: o.readingId,
          description: o.description,
          accepted: o.accepted,
          recordedBy: o.recordedBy,
        })),
        flagged: flagged.map((x) => ({
          operationId: x.operationId,
          description: x.description,
          accepted: x.acceptance !== null,
          authorId: x.authorId,
        })),
        arrivedSinceSeen,
      },
      input,
    );
    const action = input.decision === "approved" ? "review.approve" : "review.send-back";
    if (!check.ok) {
      await appendAudit(trx, [
        {
          shopId: user.shopId,
          actorId: user.id,
          deviceId,
          action,
          entity: "sign_off",
          entityId: so.id,
          workOrderId: so.workOrderId,
          outcome: "refused",
          reason: check.reason,
          detail: { stageKey: so.stageKey, input, issues: check.issues },
        },
      ]);
      return check;
    }

    const decision = await trx
      .insertInto("review_decisions")
      .values({
        sign_off_id: so.id,
        decision: input.decision,
        reason: input.decision === "sent_back" ? input.reason : "",
        reopened_step_ids: check.reopenStepIds,
        decided_by: user.id,
      })
      .returning(["id", "change_seq"])
      .executeTakeFirstOrThrow();
    if (input.acceptances.length) {
      await trx
        .insertInto("reading_acceptances")
        .values(
          input.acceptances.map((a) => ({
            shop_id: user.shopId,
            measurement_id: a.readingId,
            decision_id: decision.id,
            justification: a.justification,
            accepted_by: user.id,
          })),
        )
        .execute();
    }
    if (input.flagAcceptances.length) {
      await trx
        .insertInto("flag_acceptances")
        .values(
          input.flagAcceptances.map((a) => ({
            shop_id: user.shopId,
            operation_id: a.operationId,
            decision_id: decision.id,
            justification: a.justification,
            accepted_by: user.id,
          })),
        )
        .execute();
    }
    const described = new Map(outOfTolerance.map((o) => [o.readingId, o.description]));
    const flagDescribed = new Map(flagged.map((x) => [x.operationId, x.description]));
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        deviceId,
        action,
        entity: "sign_off",
        entityId: so.id,
        workOrderId: so.workOrderId,
        outcome: "accepted",
        reason: input.decision === "sent_back" ? input.reason : null,
        detail: {
          decisionId: decision.id,
          stageKey: so.stageKey,
          reopenedStepIds: check.reopenStepIds,
          reopenedSteps: steps.filter((s) => check.reopenStepIds.includes(s.id)).map((s) => s.title),
          acceptances: input.acceptances.map((a) => ({
            readingId: a.readingId,
            reading: described.get(a.readingId),
            justification: a.justification,
          })),
          flagAcceptances: input.flagAcceptances.map((a) => ({
            operationId: a.operationId,
            entry: flagDescribed.get(a.operationId),
            justification: a.justification,
          })),
        },
      },
    ]);
    return {
      ok: true,
      decisionId: decision.id,
      decision: input.decision,
      reopenedStepIds: check.reopenStepIds,
      accepted: input.acceptances.length + input.flagAcceptances.length,
      closedJob: isClosed(so.status),
      workOrderId: so.workOrderId,
      changeSeq: String(decision.change_seq),
    };
  });
}
