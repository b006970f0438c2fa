import "server-only";
import { sql, type Kysely } from "kysely";
import { canReach } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { buildStageReview, type DecisionFact, type StageReview } from "@/lib/review/stage-review";
import { getJobSnapshot } from "../bench/jobs";
import { stageFlaggedEntries } from "./stage";
import type { Database } from "../schema";

export interface SignOffReview extends StageReview {
  job: {
    id: string;
    number: number;
    title: string;
    status: string;
    statusLabel: string;
    bike: { make: string; model: string; tagCode: string };
  };
  /** The decision standing now (the newest on this sign-off), for the "expectedDecisionId" guard. */
  standingDecisionId: string | null;
  /** The job's place in the change sequence this review shows (its newest operation), sent back with the decision as `seenUpTo`. */
  seenUpTo: string;
  mayDecide: boolean;
  /** Why the signed-in user may not decide, when they may not. */
  whyNot: string | null;
  /**
   * Entries the sync kept and flagged on this stage (any kind), and those of the job on no stage:
   * to approve, each not yet accepted needs a written acceptance.
   */
  flagged: Array<{
    operationId: string;
    description: string;
    flagReason: string;
    by: { id: string; name: string };
    deviceTime: string;
    receivedAt: string;
    onNoStage: boolean;
    /** Received after the standing approval of this stage: it put the stage back in the queue. */
    afterApproval: boolean;
    acceptance: { by: { id: string; name: string }; justification: string; acceptedAt: string } | null;
  }>;
}

const iso = (d: unknown) => new Date(d as string | Date).toISOString();

/** Everything the review screen shows for one sign-off of the user's shop; null when there is none. */
export async function loadSignOffReview(db: Kysely<Database>, user: SessionUser, signOffId: string): Promise<SignOffReview | null> {
  const so = await db
    .selectFrom("sign_offs as s")
    .innerJoin("work_orders as w", "w.id", "s.work_order_id")
    .select(["s.work_order_id as workOrderId"])
    .where("s.id", "=", signOffId)
    .where("w.shop_id", "=", user.shopId)
    .executeTakeFirst();
  if (!so) return null;
  // Read before the record: everything up to it is in the snapshot read next (a shop's operations
  // commit in their order, under its sync lock), so the screen shows at least what it says it saw;
  // at worst a decision is refused for work the screen did show.
  const seen = await db
    .selectFrom("operations")
    .select(sql<string>`coalesce(max(seq), 0)::text`.as("seq"))
    .where("work_order_id", "=", so.workOrderId)
    .executeTakeFirstOrThrow();
  const snapshot = await getJobSnapshot(db, user, so.workOrderId);
  if (!snapshot) return null;

  const [receipts, names, acceptances, signOffs, decisions] = await Promise.all([
    db.selectFrom("operations").select(["id", "received_at", "device_id"]).where("work_order_id", "=", so.workOrderId).execute(),
    db.selectFrom("users").select(["id", "name"]).where("shop_id", "=", user.shopId).execute(),
    db
      .selectFrom("reading_acceptances as a")
      .innerJoin("measurements as m", "m.id", "a.measurement_id")
      .select(["a.measurement_id", "a.decision_id", "a.justification", "a.accepted_by", "a.accepted_at"])
      .where("m.work_order_id", "=", so.workOrderId)
      .where("a.shop_id", "=", user.shopId)
      .execute(),
    db
      .selectFrom("sign_offs as s")
      .innerJoin("operations as o", "o.id", "s.id")
      .select([
        "s.id",
        "s.job_procedure_id",
        "s.stage_key",
        "s.signed_by",
        "s.device_time",
        "s.received_at",
        "o.device_id",
        sql<string>`o.seq::text`.as("seq"),
        "o.flagged",
        "o.flag_reason",
      ])
      .where("s.work_order_id", "=", so.workOrderId)
      .execute(),
    db
      .selectFrom("review_decisions as d")
      .innerJoin("sign_offs as s", "s.id", "d.sign_off_id")
      .select([
        "d.id",
        "d.sign_off_id",
        "d.decision",
        "d.reason",
        "d.reopened_step_ids",
        "d.decided_by",
        "d.decided_at",
        sql<string>`d.change_seq::text`.as("change_seq"),
      ])
      .where("s.work_order_id", "=", so.workOrderId)
      .execute(),
  ]);

  const review = buildStageReview(
    snapshot,
    {
      receipts: new Map(receipts.map((r) => [r.id, { receivedAt: iso(r.received_at), deviceId: r.device_id }])),
      names: new Map(names.map((u) => [u.id, u.name])),
      acceptances: acceptances.map((a) => ({
        measurementId: a.measurement_id,
        decisionId: a.decision_id,
        justification: a.justification,
        acceptedBy: a.accepted_by,
        acceptedAt: iso(a.accepted_at),
      })),
      signOffs: signOffs.map((s) => ({
        id: s.id,
        jobProcedureId: s.job_procedure_id,
        stageKey: s.stage_key,
        signedBy: s.signed_by,
        deviceTime: iso(s.device_time),
        receivedAt: iso(s.received_at),
        deviceId: s.device_id,
        seq: s.seq,
        flagged: s.flagged,
        flagReason: s.flag_reason,
      })),
      decisions: decisions.map((d): DecisionFact => ({
        id: d.id,
        signOffId: d.sign_off_id,
        decision: d.decision,
        reason: d.reason,
        reopenedStepIds: d.reopened_step_ids,
        decidedBy: d.decided_by,
        decidedAt: iso(d.decided_at),
        seq: d.change_seq,
      })),
    },
    signOffId,
  );
  if (!review) return null;

  const standing = review.decisions.at(-1) ?? null;
  const entries = await stageFlaggedEntries(db, user.shopId, {
    workOrderId: so.workOrderId,
    jobProcedureId: review.stage.jobProcedureId,
    stageKey: review.stage.key,
  });
  const nameOf = (id: string) => ({ id, name: names.find((u) => u.id === id)?.name ?? "someone" });
  const approvedAt = standing?.decision === "approved" ? BigInt(standing.seq) : null;
  const whyNot = !canReach(user.role, "decide")
    ? `Your role (${user.role}) may look but not decide.`
    : review.signOff.by.id === user.id
      ? "You signed this stage off yourself: another supervisor or the office must review it."
      : review.signOff.withdrawn
        ? "This sign-off was withdrawn: the stage waits for a new sign-off."
        : !review.signOff.isLatest
          ? "This stage has been signed off again since; decide on the newest sign-off."
          : null;
  return {
    ...review,
    job: {
      id: snapshot.workOrder.id,
      number: snapshot.workOrder.number,
      title: snapshot.workOrder.title,
      status: snapshot.workOrder.status,
      statusLabel: snapshot.workOrder.statusLabel,
      bike: { make: snapshot.bike.make, model: snapshot.bike.model, tagCode: snapshot.bike.tagCode },
    },
    standingDecisionId: standing?.id ?? null,
    seenUpTo: seen.seq,
    mayDecide: whyNot === null,
    whyNot,
    flagged: entries.map((e) => ({
      operationId: e.operationId,
      description: e.description,
      flagReason: e.flagReason,
      by: nameOf(e.authorId),
      deviceTime: e.deviceTime,
      receivedAt: e.receivedAt,
      onNoStage: e.onNoStage,
      afterApproval: approvedAt !== null && BigInt(e.seq) > approvedAt,
      acceptance: e.acceptance
        ? { by: nameOf(e.acceptance.acceptedBy), justification: e.acceptance.justification, acceptedAt: e.acceptance.acceptedAt }
        : null,
    })),
  };
}
