import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { POST as settleRoute } from "@/app/api/office/outbox-handovers/[id]/settlements/route";
import { POST as moveRoute } from "@/app/api/office/work-orders/[id]/status/route";
import { listOutboxHandovers, recordOutboxHandover } from "@/db/auth/outbox-handovers";
import { startSession } from "@/db/auth/sessions";
import { decideOnSignOff } from "@/db/review/decide";
import { countReviewQueue } from "@/db/review/queue";
import { loadOpenItems } from "@/db/records/open-items";
import { moveWorkOrder } from "@/db/shop/work-orders";
import { Refusal } from "@/lib/errors";
import type { SessionUser } from "@/lib/auth/session-user";
import { Tablet } from "../bench/sync-ops";
import { closeOutJob, finishEverything, stageWork, type CloseOutJob } from "./support/close-out";
import { mailTo, useFakes } from "./support/fakes";
import { eventually, useQueueWorkers } from "./support/queue";
import { pdfText } from "./support/pdf-text";
import { sync } from "./support/review-bench";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
const ports = useFakes();
// customer e-mails go out through the queue: a worker of this run sends them
useQueueWorkers(db);

const approve = (
  flagAcceptances: Array<{ operationId: string; justification: string }> = [],
  expectedDecisionId: string | null = null,
) => ({
  decision: "approved" as const,
  expectedDecisionId,
  acceptances: [],
  flagAcceptances,
});

async function statusOf(job: CloseOutJob) {
  return (await db.selectFrom("work_orders").select("status").where("id", "=", job.workOrderId).executeTakeFirstOrThrow()).status;
}

async function movesOf(job: CloseOutJob) {
  return db.selectFrom("work_order_transitions").select(["to_status"]).where("work_order_id", "=", job.workOrderId).execute();
}

async function refusedMove(job: CloseOutJob, to: "ready" | "handed_over" = "ready") {
  try {
    await moveWorkOrder(db, job.fx.shopId, job.users.office.id, job.workOrderId, to);
  } catch (e) {
    expect(e).toBeInstanceOf(Refusal);
    return e as Refusal;
  }
  throw new Error("the move went through");
}

const postMove = (job: CloseOutJob, user: SessionUser, body: unknown) =>
  moveRoute.handle(
    appRequest(`/api/office/work-orders/${job.workOrderId}/status`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(body),
    }),
    { user, db, params: { id: job.workOrderId } },
  );

describe("the gates on ready and handed over (real PostgreSQL)", () => {
  it("a fresh job: every step not done and every stage not signed off is listed; the refusal changes nothing and is audited", async () => {
    const job = await closeOutJob(db);
    const before = await movesOf(job);
    const e = await refusedMove(job);
    expect(e.status).toBe(409);
    expect(e.message).toMatch(/cannot move to "Ready" while items are still open \(3 steps not done, 2 stages not signed off\)/);
    expect(e.issues.map((i) => i.message)).toEqual([
      "Check the gap › Measure the gap: Not done yet: Cover gap: 2 of 2 readings to record.",
      "Check the gap › Fit the cover: Not done yet.",
      "Check the gap: The stage is not signed off.",
      "Close up › Seal and label: Not done yet.",
      "Close up: The stage is not signed off.",
    ]);
    expect(e.issues.every((i) => i.path === "openItems")).toBe(true);
    expect(await statusOf(job)).toBe("on_dyno");
    expect(await movesOf(job)).toEqual(before);
    const audit = await db
      .selectFrom("audit_log")
      .select(["action", "outcome", "detail"])
      .where("work_order_id", "=", job.workOrderId)
      .where("action", "=", "work_order.move")
      .execute();
    expect(audit).toEqual([
      expect.objectContaining({ outcome: "refused", detail: expect.objectContaining({ to: "ready", openItems: expect.any(Array) }) }),
    ]);
  });

  it("a stage signed off with no decision, and a reading out of tolerance nobody let stand, are open", async () => {
    const job = await closeOutJob(db);
    const w = stageWork(job, "check", [0.15, 1.6]); // right side ten times its limit
    await sync(db, job.users.mech, job.tablet, w.ops);
    const items = (await loadOpenItems(db, job.fx.shopId, job.workOrderId))!;
    expect(items.filter((i) => i.stage?.key === "check").map((i) => [i.kind, i.reason])).toEqual([
      ["reading_not_accepted", expect.stringContaining("Cover gap, Right 1.6 mm (above the limits 0.1 to 0.2 mm)")],
      ["sign_off_not_decided", "Signed off, but no supervisor has approved it yet."],
    ]);
    expect(items.find((i) => i.kind === "sign_off_not_decided")?.signOffId).toBe(w.signOff.id);
    expect((await refusedMove(job)).issues.map((i) => i.message)).toContain(
      "Check the gap: Signed off, but no supervisor has approved it yet.",
    );
  });

  it("a step sent back and not redone is open until it is done again and signed off again", async () => {
    const job = await closeOutJob(db);
    const w = stageWork(job, "check");
    await sync(db, job.users.mech, job.tablet, w.ops);
    const back = await decideOnSignOff(db, job.users.sup, w.signOff.id, {
      decision: "sent_back",
      expectedDecisionId: null,
      reason: "Cover sits proud on the left",
      reopenStepIds: [job.steps["fit-cover"]],
      acceptances: [],
      flagAcceptances: [],
    });
    expect(back.ok).toBe(true);
    let items = (await loadOpenItems(db, job.fx.shopId, job.workOrderId))!.filter((i) => i.stage?.key === "check");
    expect(items.map((i) => [i.kind, i.step?.title ?? null])).toEqual([
      ["sent_back_not_redone", "Fit the cover"],
      ["stage_not_signed_off", null],
    ]);
    expect(items[0].reason).toBe("Sent back by the supervisor (“Cover sits proud on the left”) and not redone yet.");
    // the redo, once the tablet has the send-back (a completion made before it knew would be flagged)
    await sync(db, job.users.mech, job.tablet);
    await sync(db, job.users.mech, job.tablet, [job.tablet.complete(job.steps["fit-cover"])]);
    items = (await loadOpenItems(db, job.fx.shopId, job.workOrderId))!.filter((i) => i.stage?.key === "check");
    expect(items.map((i) => i.kind)).toEqual(["stage_not_signed_off"]);
  });

  it("a flagged entry needs a written acceptance; with everything settled both moves go through and the report is stored", async () => {
    const job = await closeOutJob(db);
    await finishEverything(db, job);
    expect(await loadOpenItems(db, job.fx.shopId, job.workOrderId)).toEqual([]);
    // a tablet whose clock is 10 minutes ahead: its completion is kept and flagged
    const fast = new Tablet("fast-tablet", job.users.mech.id, job.workOrderId, () => Date.now() + 10 * 60_000);
    const late = fast.complete(job.steps.seal);
    const r = await sync(db, job.users.mech, fast, [late]);
    expect(r.flagged.map((f) => f.id)).toEqual([late.id]);
    const items = (await loadOpenItems(db, job.fx.shopId, job.workOrderId))!;
    expect(items).toEqual([
      expect.objectContaining({
        kind: "flagged_not_accepted",
        stage: expect.objectContaining({ key: "close" }),
        step: { id: job.steps.seal, title: "Seal and label" },
        reason: expect.stringMatching(/^Step done flagged and not accepted: Its stamp is 1\d min ahead/),
      }),
    ]);
    expect((await refusedMove(job)).issues).toHaveLength(1);

    // approving the stage again needs the written acceptance of the entry
    const close = await db
      .selectFrom("sign_offs")
      .select("id")
      .where("work_order_id", "=", job.workOrderId)
      .where("stage_key", "=", "close")
      .executeTakeFirstOrThrow();
    const standing = await db.selectFrom("review_decisions").select("id").where("sign_off_id", "=", close.id).executeTakeFirstOrThrow();
    const without = await decideOnSignOff(db, job.users.sup, close.id, approve([], standing.id));
    expect(without).toMatchObject({ ok: false, status: 422, issues: [{ path: `flagged.${late.id}` }] });
    const accepted = await decideOnSignOff(
      db,
      job.users.sup,
      close.id,
      approve([{ operationId: late.id, justification: "Tablet clock was wrong; the seal was done that afternoon" }], standing.id),
    );
    expect(accepted.ok).toBe(true);
    const row = await db.selectFrom("flag_acceptances").selectAll().where("operation_id", "=", late.id).executeTakeFirstOrThrow();
    expect(row).toMatchObject({ accepted_by: job.users.sup.id, justification: "Tablet clock was wrong; the seal was done that afternoon" });
    await expect(db.deleteFrom("flag_acceptances").where("id", "=", row.id).execute()).rejects.toThrow(/append-only/);
    const audit = await db
      .selectFrom("audit_log")
      .select("detail")
      .where("entity_id", "=", close.id)
      .where("action", "=", "review.approve")
      .where("outcome", "=", "accepted")
      .orderBy("id", "desc")
      .executeTakeFirstOrThrow();
    expect(audit.detail).toMatchObject({ flagAcceptances: [{ operationId: late.id, justification: expect.any(String) }] });

    expect(await loadOpenItems(db, job.fx.shopId, job.workOrderId)).toEqual([]);
    const ready = await postMove(job, job.users.office, { to: "ready" });
    expect(ready.status).toBe(200);
    const handed = await postMove(job, job.users.office, { to: "handed_over" });
    expect(handed.status).toBe(200);
    const body = await handed.json();
    expect(body).toMatchObject({
      status: "handed_over",
      overrideId: null,
      report: { revision: 1, sha256: expect.stringMatching(/^[0-9a-f]{64}$/) },
    });
    expect(await db.selectFrom("status_overrides").select("id").where("work_order_id", "=", job.workOrderId).execute()).toEqual([]);
  });

  it("the move to handed over is gated too: late bench work on a job waiting for collection", async () => {
    const job = await closeOutJob(db);
    await finishEverything(db, job);
    await moveWorkOrder(db, job.fx.shopId, job.users.office.id, job.workOrderId, "ready");
    // the job is not open for bench work any more: this reading is kept and flagged
    const r = await sync(db, job.users.mech, job.tablet, [job.tablet.read(job.steps["measure-gap"], job.specId, 0, 0.18)]);
    expect(r.flagged).toHaveLength(1);
    const e = await refusedMove(job, "handed_over");
    expect(e.message).toMatch(/cannot move to "Handed over".*1 flagged entry not accepted/);
    expect(e.issues[0].message).toMatch(/^Check the gap › Measure the gap: Reading \(0\.18 mm\) flagged and not accepted/);
    expect(await statusOf(job)).toBe("ready");
    expect(await db.selectFrom("invoices").select("id").where("work_order_id", "=", job.workOrderId).execute()).toEqual([]);
    expect(await db.selectFrom("report_revisions").select("id").where("work_order_id", "=", job.workOrderId).execute()).toEqual([]);
  });

  it("work withdrawn from a stage the supervisor approved puts the stage back in review, and the gate holds until it is accepted", async () => {
    const job = await closeOutJob(db);
    // before any decision a withdrawal is an ordinary correction: kept, not flagged
    const early = job.tablet.complete(job.steps.seal);
    await sync(db, job.users.mech, job.tablet, [early]);
    const fix = job.tablet.make("entry.withdrawn", { operationId: early.id, reason: "Tapped the wrong step" });
    const r0 = await sync(db, job.users.mech, job.tablet, [fix]);
    expect(r0.accepted).toEqual([fix.id]);
    expect(r0.flagged).toEqual([]);

    await finishEverything(db, job);
    expect(await loadOpenItems(db, job.fx.shopId, job.workOrderId)).toEqual([]);
    const done = await db
      .selectFrom("step_completions as c")
      .select("c.id")
      .where("c.work_order_id", "=", job.workOrderId)
      .where("c.step_id", "=", job.steps["fit-cover"])
      .executeTakeFirstOrThrow();
    // after the approval: the cover's completion is withdrawn and the step done again
    const withdraw = job.tablet.make("entry.withdrawn", { operationId: done.id, reason: "Cover came off again for a leak" });
    const redo = job.tablet.complete(job.steps["fit-cover"]);
    const r = await sync(db, job.users.mech, job.tablet, [withdraw, redo]);
    // both change the approved record: the withdrawal and the step done again are kept and flagged
    expect(r.flagged.map((f) => f.id)).toEqual([withdraw.id, redo.id]);
    expect(r.flagged[0].reason).toMatch(/^Withdrawn from step “Fit the cover” after the supervisor approved its stage/);
    expect(r.flagged[1].reason).toMatch(/^Recorded on step “Fit the cover” after the supervisor approved its stage/);
    const items = (await loadOpenItems(db, job.fx.shopId, job.workOrderId))!;
    const onCover = expect.objectContaining({
      kind: "flagged_not_accepted",
      stage: expect.objectContaining({ key: "check" }),
      step: { id: job.steps["fit-cover"], title: "Fit the cover" },
    });
    expect(items).toEqual([onCover, onCover]);
    expect((await refusedMove(job)).issues).toHaveLength(2);
    expect(await statusOf(job)).toBe("on_dyno");

    // the supervisor looks at the stage again and accepts the withdrawal in writing: nothing is open
    const check = await db
      .selectFrom("sign_offs")
      .select("id")
      .where("work_order_id", "=", job.workOrderId)
      .where("stage_key", "=", "check")
      .executeTakeFirstOrThrow();
    const standing = await db.selectFrom("review_decisions").select("id").where("sign_off_id", "=", check.id).executeTakeFirstOrThrow();
    const ok = await decideOnSignOff(
      db,
      job.users.sup,
      check.id,
      approve(
        [
          { operationId: withdraw.id, justification: "Leak fixed and cover refitted; checked it myself" },
          { operationId: redo.id, justification: "Cover refitted with a new gasket; torque checked" },
        ],
        standing.id,
      ),
    );
    expect(ok.ok).toBe(true);
    expect(await loadOpenItems(db, job.fx.shopId, job.workOrderId)).toEqual([]);
  });

  it("a reading recorded on a stage after the supervisor approved it (in tolerance, from another tablet) goes back to review and holds the gate", async () => {
    const job = await closeOutJob(db);
    await finishEverything(db, job);
    expect(await loadOpenItems(db, job.fx.shopId, job.workOrderId)).toEqual([]);
    const queued = await countReviewQueue(db, job.fx.shopId);
    const second = new Tablet(`second-${randomUUID().slice(0, 8)}`, job.users.mech.id, job.workOrderId);
    const again = second.read(job.steps["measure-gap"], job.specId, 0, 0.16);
    const r = await sync(db, job.users.mech, second, [again]);
    expect(r.flagged.map((f) => f.id)).toEqual([again.id]);
    expect(r.flagged[0].reason).toMatch(/^Recorded on step “Measure the gap” after the supervisor approved its stage/);
    expect((await loadOpenItems(db, job.fx.shopId, job.workOrderId))!.map((i) => i.kind)).toEqual(["flagged_not_accepted"]);
    expect(await countReviewQueue(db, job.fx.shopId)).toBe(queued + 1);
    expect((await refusedMove(job)).issues).toHaveLength(1);
    expect(await statusOf(job)).toBe("on_dyno");
  });

  it("withdrawing a flagged sign-off nobody decided on keeps its flag in front of the supervisor", async () => {
    const job = await closeOutJob(db);
    // a tablet whose clock is 10 minutes ahead: its sign-off is kept and flagged
    const fast = new Tablet("fast-tablet-3", job.users.mech.id, job.workOrderId, () => Date.now() + 10 * 60_000);
    const signOff = fast.make("stage.signed-off", job.stages.close);
    expect((await sync(db, job.users.mech, fast, [signOff])).flagged.map((f) => f.id)).toEqual([signOff.id]);
    const withdraw = fast.make("entry.withdrawn", { operationId: signOff.id, reason: "Signed off on the wrong tablet" });
    const r = await sync(db, job.users.mech, fast, [withdraw]);
    expect(r.flagged.find((f) => f.id === withdraw.id)?.reason).toMatch(/had been flagged for the supervisor and not yet accepted/);
  });

  it("withdrawing a flagged entry nobody accepted keeps it in front of the supervisor", async () => {
    const job = await closeOutJob(db);
    // a tablet whose clock is 10 minutes ahead: its completion is kept and flagged
    const fast = new Tablet("fast-tablet-2", job.users.mech.id, job.workOrderId, () => Date.now() + 10 * 60_000);
    const late = fast.complete(job.steps.seal);
    expect((await sync(db, job.users.mech, fast, [late])).flagged.map((f) => f.id)).toEqual([late.id]);
    const withdraw = fast.make("entry.withdrawn", { operationId: late.id, reason: "Recorded on the wrong tablet" });
    const r = await sync(db, job.users.mech, fast, [withdraw]);
    expect(r.flagged.map((f) => f.id)).toContain(withdraw.id);
    expect(r.flagged.find((f) => f.id === withdraw.id)!.reason).toMatch(/had been flagged for the supervisor and not yet accepted/);
    const items = (await loadOpenItems(db, job.fx.shopId, job.workOrderId))!;
    expect(items.filter((i) => i.kind === "flagged_not_accepted").map((i) => i.key)).toEqual([`flagged_not_accepted:${withdraw.id}`]);
  });

  it("work a tablet handed over when its session was ended holds the job's gates until the office settles it with a note", async () => {
    const job = await closeOutJob(db);
    const other = await closeOutJob(db);
    await finishEverything(db, job);
    const sessionId = await startSession(db, job.fx.users.mechanic, { address: "127.0.0.1", userAgent: "handover-gate" });
    const entry = (workOrderId: unknown) => ({
      id: randomUUID(),
      workOrderId,
      stamp: "x",
      op: { kind: "step.completed" },
      state: "queued",
    });
    const made = await recordOutboxHandover(db, {
      shopId: job.fx.shopId,
      userId: job.users.mech.id,
      sessionId,
      deviceId: "bay-3",
      // two entries on this job; one on another shop's job, one naming none, one odd: they hold nothing
      entries: [entry(job.workOrderId), entry(job.workOrderId.toUpperCase()), entry(other.workOrderId), entry(undefined), entry(42)],
      // a photo of the job whose bytes never went up holds it too; one naming no job holds nothing
      photosLeft: [
        { id: randomUUID(), workOrderId: job.workOrderId, stepId: job.steps["fit-cover"], byteSize: 1200, caption: "cover seated" },
        { id: randomUUID(), stepId: job.steps["fit-cover"], byteSize: 900, caption: "from an older tablet" },
      ],
    });
    const reason =
      "2 entries and 1 photo not uploaded recorded by " +
      job.fx.users.mechanic.name +
      " on tablet bay-3 were handed over unsent when the session was ended: re-enter what belongs on the record, then settle the hand-over with a note on the Sign-ins page.";
    expect(await loadOpenItems(db, job.fx.shopId, job.workOrderId)).toEqual([
      { key: `handover_not_settled:${made.id}`, kind: "handover_not_settled", stage: null, step: null, reason, signOffId: null },
    ]);
    expect(await loadOpenItems(db, other.fx.shopId, other.workOrderId)).not.toContainEqual(
      expect.objectContaining({ kind: "handover_not_settled" }),
    );
    const refused = await refusedMove(job);
    expect(refused.message).toMatch(/\(1 hand-over of unsent work not settled\)/);
    expect(refused.issues.map((i) => i.message)).toEqual([reason]);

    const settle = (user: SessionUser, body: unknown, id = made.id) =>
      settleRoute.handle(
        appRequest(`/api/office/outbox-handovers/${id}/settlements`, {
          method: "POST",
          headers: { "content-type": "application/json" },
          body: JSON.stringify(body),
        }),
        { user, db, params: { id } },
      );
    const short = await settle(job.users.office, { workOrderId: job.workOrderId, note: "done" });
    expect(short.status).toBe(400);
    expect((await short.json()).issues).toEqual([
      { path: "note", message: "Write at least 10 characters: what was re-entered on the record, or why nothing needs to be." },
    ]);
    expect((await settle(job.users.office, { workOrderId: other.workOrderId, note: "Nothing of this job here." })).status).toBe(404);
    const note = "Both steps re-entered by Tomas at the bench on 4 Dec; photos retaken.";
    expect((await settle(job.users.office, { workOrderId: job.workOrderId, note })).status).toBe(201);
    const again = await settle(job.users.office, { workOrderId: job.workOrderId, note });
    expect(again.status).toBe(409);
    expect((await again.json()).error).toMatch(/settled already/);

    expect(await loadOpenItems(db, job.fx.shopId, job.workOrderId)).toEqual([]);
    await moveWorkOrder(db, job.fx.shopId, job.users.office.id, job.workOrderId, "ready");
    expect(await statusOf(job)).toBe("ready");
    const [listed] = await listOutboxHandovers(db, job.fx.shopId);
    expect(listed.jobs).toEqual([
      expect.objectContaining({ workOrderId: job.workOrderId, entryCount: 2, photoCount: 1, note, settledBy: job.fx.users.office.name }),
    ]);
    const audit = await db
      .selectFrom("audit_log")
      .select(["outcome", "actor_id"])
      .where("action", "=", "outbox.settled")
      .where("work_order_id", "=", job.workOrderId)
      .orderBy("id")
      .execute();
    expect(audit).toEqual([
      { outcome: "accepted", actor_id: job.users.office.id },
      { outcome: "refused", actor_id: job.users.office.id },
    ]);
    // the settlement naming a job the hand-over does not hold is on the log too
    const wrongJob = await db
      .selectFrom("audit_log")
      .select(["outcome", "reason", "shop_id", "work_order_id"])
      .where("action", "=", "outbox.settled")
      .where("entity_id", "=", made.id)
      .where("outcome", "=", "refused")
      .where("reason", "=", "no entries on that job in this hand-over")
      .execute();
    // (the other shop's job is named in the detail only, never tied to this shop's log entry)
    expect(wrongJob).toEqual([
      { outcome: "refused", reason: "no entries on that job in this hand-over", shop_id: job.fx.shopId, work_order_id: null },
    ]);
  });

  it("a job with no procedure pinned has nothing to review: the gate says so", async () => {
    const job = await closeOutJob(db);
    await db.deleteFrom("job_procedures").where("work_order_id", "=", job.workOrderId).execute();
    expect((await refusedMove(job)).issues.map((i) => i.message)).toEqual([
      "No procedure is pinned on this work order: there is no build record to review.",
    ]);
  });
});

describe("the office's override (real PostgreSQL, through the route)", () => {
  const REASON = "Customer collects for a track day; the head is checked when the bike comes back";

  it("moves with items open only with a written reason, and records who, when, why and the items", async () => {
    const job = await closeOutJob(db);
    const w = stageWork(job, "check");
    await sync(db, job.users.mech, job.tablet, w.ops);
    const items = (await loadOpenItems(db, job.fx.shopId, job.workOrderId))!;
    expect(items.length).toBeGreaterThan(0);

    // no override: refused with every open item
    const plain = await postMove(job, job.users.office, { to: "ready" });
    expect(plain.status).toBe(409);
    expect((await plain.json()).issues).toHaveLength(items.length);

    // a reason too short, in workshop words; nothing changes
    const short = await postMove(job, job.users.office, {
      to: "ready",
      override: { reason: "ok fine", openItemKeys: items.map((i) => i.key) },
    });
    expect(short.status).toBe(400);
    expect((await short.json()).issues).toEqual([
      {
        path: "override.reason",
        message: "Reason for the override: write at least 3 words (15 characters) saying why the job moves on with items open.",
      },
    ]);
    const fewWords = await postMove(job, job.users.office, {
      to: "ready",
      override: { reason: "Because-we-said-so today", openItemKeys: [] },
    });
    expect((await fewWords.json()).issues).toEqual([
      { path: "override.reason", message: "Reason for the override: write at least 3 words saying why the job moves on with items open." },
    ]);
    const nul = await postMove(job, job.users.office, {
      to: "ready",
      override: { reason: `Because \u0000 we said so today`, openItemKeys: [] },
    });
    expect((await nul.json()).issues[0]).toEqual({
      path: "override.reason",
      message: "Reason for the override holds a NUL character, which cannot be stored: retype it.",
    });
    // a list that is not the one on record now
    const stale = await postMove(job, job.users.office, {
      to: "ready",
      override: { reason: REASON, openItemKeys: items.slice(1).map((i) => i.key) },
    });
    expect(stale.status).toBe(409);
    expect((await stale.json()).issues).toEqual([
      { path: "override.openItemKeys", message: "Open items: the list on your screen is not the list on record now." },
    ]);
    // an override on a move that has no gate
    const notGated = await postMove(job, job.users.office, { to: "in_build", override: { reason: REASON, openItemKeys: [] } });
    expect(notGated.status).toBe(409);
    expect((await notGated.json()).issues[0].path).toBe("override");
    expect(await statusOf(job)).toBe("on_dyno");
    expect(await db.selectFrom("status_overrides").select("id").where("work_order_id", "=", job.workOrderId).execute()).toEqual([]);

    // the override: moved, recorded, e-mailed plainly
    const ok = await postMove(job, job.users.office, { to: "ready", override: { reason: REASON, openItemKeys: items.map((i) => i.key) } });
    expect(ok.status).toBe(200);
    const moved = await ok.json();
    expect(moved.overrideId).toEqual(expect.any(String));
    const rec = await db.selectFrom("status_overrides").selectAll().where("id", "=", moved.overrideId).executeTakeFirstOrThrow();
    expect(rec).toMatchObject({ from_status: "on_dyno", to_status: "ready", reason: REASON, by_user_id: job.users.office.id });
    expect(rec.at).toBeInstanceOf(Date);
    expect(rec.open_items).toEqual(JSON.parse(JSON.stringify(items)));
    await expect(
      db.updateTable("status_overrides").set({ reason: "changed later on purpose" }).where("id", "=", rec.id).execute(),
    ).rejects.toThrow(/append-only/);
    const audit = await db
      .selectFrom("audit_log")
      .select(["actor_id", "reason", "detail", "outcome"])
      .where("work_order_id", "=", job.workOrderId)
      .where("action", "=", "work_order.override")
      .execute();
    // the refused attempts (stale list, no gate) are on record too
    expect(audit.filter((a) => a.outcome === "refused")).toHaveLength(2);
    expect(audit.filter((a) => a.outcome === "accepted")).toEqual([
      expect.objectContaining({
        actor_id: job.users.office.id,
        reason: REASON,
        detail: expect.objectContaining({ to: "ready" }),
      }),
    ]);
    const to = `c-${job.fx.bike.tag_code.slice(3)}@example.test`;
    await eventually(async () => (await mailTo(ports.mailWeb, to)).some((m) => m.subject.includes("ready to collect")));
    const ready = (await mailTo(ports.mailWeb, to)).find((m) => m.subject.includes("ready to collect"))!;
    expect(ready.text).toContain("Please note: your bike was released for collection with work on its record not finished or not checked");
    expect(ready.text).toContain(REASON);
    expect(ready.text).toContain("- Close up › Seal and label: Not done yet.");
    // the build report attached is the copy stored in the move's own transaction
    expect(ready.attachments?.map((a) => a.contentType)).toEqual(["application/pdf"]);
    const queued = await db
      .selectFrom("mail_outbox")
      .select(["attachment", "attachment_key"])
      .where("work_order_id", "=", job.workOrderId)
      .where("kind", "=", "bike_ready")
      .executeTakeFirstOrThrow();
    expect(queued).toEqual({
      attachment: "stored_report",
      attachment_key: expect.stringMatching(new RegExp(`^reports/${job.fx.shopId}/${job.workOrderId}/ready-\\d+-[0-9a-f]{64}\\.pdf$`)),
    });

    // a replay of the plain move to handed over: the override for "ready" is no permit for it
    const replay = await postMove(job, job.users.office, { to: "handed_over" });
    expect(replay.status).toBe(409);
    expect(await statusOf(job)).toBe("ready");
    // a replay of the override request itself: the job is no longer where it was
    const again = await postMove(job, job.users.office, {
      to: "ready",
      override: { reason: REASON, openItemKeys: items.map((i) => i.key) },
    });
    expect(again.status).toBe(409);
    expect(await db.selectFrom("status_overrides").select("id").where("work_order_id", "=", job.workOrderId).execute()).toHaveLength(1);

    // handed over with its own override: printed on page one of the stored report
    const now = (await loadOpenItems(db, job.fx.shopId, job.workOrderId))!;
    const hand = await postMove(job, job.users.office, {
      to: "handed_over",
      override: { reason: REASON, openItemKeys: now.map((i) => i.key) },
    });
    expect(hand.status).toBe(200);
    const stored = await db
      .selectFrom("report_revisions")
      .select(["object_key", "sha256"])
      .where("work_order_id", "=", job.workOrderId)
      .executeTakeFirstOrThrow();
    const { getObject } = await import("@/app/_server/object-store");
    const pageOne = await pdfText((await getObject(stored.object_key)).body, [1]);
    expect(pageOne).toContain("Handed over with open items:");
    expect(pageOne).toContain(REASON.split(" ").slice(0, 6).join(" "));
    expect(pageOne).toContain(`By ${job.fx.users.office.name}`);
  });

  it("only the office may override: a supervisor's request is refused by role", async () => {
    const job = await closeOutJob(db);
    const r = await postMove(job, job.users.sup, { to: "ready", override: { reason: REASON, openItemKeys: [] } });
    expect(r.status).toBe(403);
    expect(await statusOf(job)).toBe("on_dyno");
  });
});
