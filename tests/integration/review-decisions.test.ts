import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { getJobSnapshot } from "@/db/bench/jobs";
import { decideOnSignOff } from "@/db/review/decide";
import { loadSignOffReview } from "@/db/review/detail";
import { countReviewQueue, pageReviewQueue } from "@/db/review/queue";
import { buildWorkOrderView } from "@/lib/work-order-record";
import { decisionInputSchema } from "@/lib/review/decision-input";
import { queueQuerySchema } from "@/lib/review/list-queries";
import { Tablet } from "../bench/sync-ops";
import { measureStageWork, reviewSetup, sync } from "./support/review-bench";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
const queue = (shopId: string, q: Record<string, string> = {}) => pageReviewQueue(db, shopId, queueQuerySchema.parse(q));
const audits = (workOrderId: string, action: string) =>
  db.selectFrom("audit_log").selectAll().where("work_order_id", "=", workOrderId).where("action", "=", action).orderBy("id").execute();

describe("review decisions on synced sign-offs", () => {
  it("approve: the sign-off leaves the queue, the decision is audited and reaches the tablet's next sync", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const tablet = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage);
    await sync(db, users.mech, tablet, ops);

    const waiting = await queue(fx.shopId);
    expect(waiting.total).toBe(1);
    expect(waiting.rows[0]).toMatchObject({
      signOffId: signOff.id,
      stageTitle: "Measure before assembly",
      mechanicName: users.mech.name,
      outOfTolerance: 0,
      resubmitted: false,
      number: 1,
    });
    expect(await countReviewQueue(db, fx.shopId)).toBe(1);

    const review = await loadSignOffReview(db, users.sup, signOff.id);
    expect(review?.mayDecide).toBe(true);
    expect(review?.steps.map((s) => s.title)).toEqual([
      "Bore gauge cylinder 1",
      "Piston-to-wall clearance",
      "Top ring end gap",
      "Main bearing oil clearance",
    ]);
    expect(review?.steps[0].specs[0].spots).toHaveLength(6);
    expect(review?.steps[0].completions[0]).toMatchObject({ by: { id: users.mech.id }, deviceId: "bay-1" });
    expect(review?.outOfTolerance).toEqual([]);
    expect(review?.defaultReopenStepIds).toEqual(stepIds);

    const r = await decideOnSignOff(
      db,
      users.sup,
      signOff.id,
      decisionInputSchema.parse({ decision: "approved", expectedDecisionId: null }),
    );
    expect(r).toMatchObject({ ok: true, decision: "approved", reopenedStepIds: [] });
    expect((await queue(fx.shopId)).total).toBe(0);

    const logged = await audits(fx.workOrderId, "review.approve");
    expect(logged).toHaveLength(1);
    expect(logged[0]).toMatchObject({ actor_id: users.sup.id, outcome: "accepted", entity: "sign_off", entity_id: signOff.id });

    const next = await sync(db, users.mech, tablet);
    // the change names the decision and its job; the tablet fetches the job's fresh copy
    expect(next.changes).toEqual([expect.objectContaining({ type: "review", id: r.ok ? r.decisionId : "", workOrderId: fx.workOrderId })]);
  });

  it("send back with a reason: exactly the chosen steps reopen on the tablet, a redo and a new sign-off go back in the queue, then approve", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const ringGapStep = fx.stepByKey["ring-gap"].id;
    const tablet = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage, { "top-ring-gap:1": 0.5 });
    await sync(db, users.mech, tablet, ops);

    const [row] = (await queue(fx.shopId, { outOfTolerance: "yes" })).rows;
    expect(row).toMatchObject({ signOffId: signOff.id, outOfTolerance: 1 });
    const review = await loadSignOffReview(db, users.sup, signOff.id);
    expect(review?.outOfTolerance).toEqual([
      expect.objectContaining({
        stepId: ringGapStep,
        specLabel: "Top ring gap",
        readingLabel: "Cyl 2",
        value: "0.5", // the decimal text, as typed
        verdict: "high",
        acceptance: null,
      }),
    ]);
    // the default choice for a send-back: the step holding the reading out of tolerance
    expect(review?.defaultReopenStepIds).toEqual([ringGapStep]);

    // A send-back without a reason never reaches the database.
    const noReason = decisionInputSchema.safeParse({
      decision: "sent_back",
      expectedDecisionId: null,
      reason: "  ",
      reopenStepIds: [ringGapStep],
    });
    expect(noReason.success).toBe(false);
    expect(noReason.error?.issues[0]).toMatchObject({ path: ["reason"] });
    expect(noReason.error?.issues[0].message).toMatch(/Say why it goes back/);

    // A step from another stage cannot be reopened by this sign-off.
    const wrongStep = await decideOnSignOff(
      db,
      users.sup,
      signOff.id,
      decisionInputSchema.parse({
        decision: "sent_back",
        expectedDecisionId: null,
        reason: "Regap cylinder 2",
        reopenStepIds: [fx.stepByKey["rod-bolts"].id],
      }),
    );
    expect(wrongStep).toMatchObject({
      ok: false,
      status: 422,
      issues: [{ path: "reopenStepIds.0", message: "This step is not part of the signed-off stage." }],
    });

    const reason = "Cyl 2 ring gap over the limit: regap the ring and read it again";
    const sent = await decideOnSignOff(
      db,
      users.sup,
      signOff.id,
      decisionInputSchema.parse({ decision: "sent_back", expectedDecisionId: null, reason, reopenStepIds: [ringGapStep] }),
    );
    if (!sent.ok) throw new Error(sent.reason);
    expect(sent.reopenedStepIds).toEqual([ringGapStep]);

    // The tablet's next sync carries the send-back; the bench view reopens exactly that step, with the reason.
    const next = await sync(db, users.mech, tablet);
    expect(next.changes).toEqual([expect.objectContaining({ type: "review", id: sent.decisionId, workOrderId: fx.workOrderId })]);
    const snapshot = await getJobSnapshot(db, users.mech, fx.workOrderId);
    const view = buildWorkOrderView(snapshot!, [], Date.now());
    const measure = view.stages.find((s) => s.key === "measure")!;
    expect(measure.steps.filter((s) => s.reopened).map((s) => s.step.id)).toEqual([ringGapStep]);
    expect(measure.steps.find((s) => s.step.id === ringGapStep)?.reopened?.reason).toBe(reason);
    expect(measure.signedOff).toBeNull();
    expect((await queue(fx.shopId)).total).toBe(0);

    // Redo: correct the reading (the old one stays), do the step again, sign off again.
    const high = (
      await db
        .selectFrom("measurements")
        .select("id")
        .where("spec_id", "=", specs["top-ring-gap"].id)
        .where("reading_index", "=", 1)
        .executeTakeFirstOrThrow()
    ).id;
    const fix = tablet.read(ringGapStep, specs["top-ring-gap"].id, 1, 0.44, { supersedesId: high });
    const redo = tablet.complete(ringGapStep);
    const signOff2 = tablet.make("stage.signed-off", stage);
    const merged = await sync(db, users.mech, tablet, [fix, redo, signOff2]);
    expect(merged.accepted).toEqual([fix.id, redo.id, signOff2.id]);
    expect(merged.flagged).toEqual([]);
    const after = buildWorkOrderView((await getJobSnapshot(db, users.mech, fx.workOrderId))!, [], Date.now());
    expect(after.stages.find((s) => s.key === "measure")?.steps.every((s) => s.done && !s.reopened)).toBe(true);

    const again = await queue(fx.shopId);
    expect(again.rows.map((r) => ({ id: r.signOffId, oot: r.outOfTolerance, resubmitted: r.resubmitted }))).toEqual([
      { id: signOff2.id, oot: 0, resubmitted: true },
    ]);
    const review2 = await loadSignOffReview(db, users.sup, signOff2.id);
    const spot = review2!.steps.find((s) => s.id === ringGapStep)!.specs[0].spots[1];
    expect(spot.history.map((h) => ({ value: h.value, current: h.current, supersededBy: h.supersededBy }))).toEqual([
      { value: "0.5", current: false, supersededBy: fix.id },
      { value: "0.44", current: true, supersededBy: null },
    ]);
    expect(review2!.steps.find((s) => s.id === ringGapStep)!.sentBack).toEqual([expect.objectContaining({ reason })]);
    expect(review2!.earlier).toEqual([
      expect.objectContaining({ id: signOff.id, decisions: [expect.objectContaining({ decision: "sent_back", reason })] }),
    ]);

    // The old sign-off can no longer be decided on; the new one can.
    const stale = await decideOnSignOff(
      db,
      users.sup,
      signOff.id,
      decisionInputSchema.parse({ decision: "approved", expectedDecisionId: sent.decisionId }),
    );
    expect(stale).toMatchObject({ ok: false, status: 409 });
    const ok = await decideOnSignOff(
      db,
      users.sup,
      signOff2.id,
      decisionInputSchema.parse({ decision: "approved", expectedDecisionId: null }),
    );
    expect(ok).toMatchObject({ ok: true, decision: "approved" });
    expect((await queue(fx.shopId)).total).toBe(0);

    const trail = await db
      .selectFrom("audit_log")
      .select(["action", "outcome"])
      .where("work_order_id", "=", fx.workOrderId)
      .where("action", "like", "review.%")
      .orderBy("id")
      .execute();
    expect(trail).toEqual([
      { action: "review.send-back", outcome: "refused" },
      { action: "review.send-back", outcome: "accepted" },
      { action: "review.approve", outcome: "refused" },
      { action: "review.approve", outcome: "accepted" },
    ]);
  });

  it("an out-of-tolerance reading can be let stand only with a written justification, which is kept", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const tablet = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage, { "main-oil-clearance:2": 0.046 });
    await sync(db, users.mech, tablet, ops);
    const review = await loadSignOffReview(db, users.sup, signOff.id);
    const [oot] = review!.outOfTolerance;
    expect(oot).toMatchObject({ readingLabel: "Main 3", value: "0.046", verdict: "high" });

    const plain = await decideOnSignOff(
      db,
      users.sup,
      signOff.id,
      decisionInputSchema.parse({ decision: "approved", expectedDecisionId: null }),
    );
    expect(plain).toMatchObject({ ok: false, status: 422 });
    if (plain.ok) throw new Error("unexpected");
    expect(plain.issues).toEqual([
      {
        path: `reading.${oot.readingId}`,
        message: expect.stringMatching(
          /^Main bearing oil clearance, Main 3: 0\.046 mm \(high; limits 0\.02–0\.044 mm\) is out of tolerance/,
        ),
      },
    ]);

    const short = decisionInputSchema.safeParse({
      decision: "approved",
      expectedDecisionId: null,
      acceptances: [{ readingId: oot.readingId, justification: "ok" }],
    });
    expect(short.success).toBe(false);
    expect(short.error?.issues[0]).toMatchObject({ path: ["acceptances", 0, "justification"] });

    const justification = "Bearing maker's sheet allows 0.048 mm for this shell grade; Plastigauge check agrees.";
    const ok = await decideOnSignOff(
      db,
      users.sup,
      signOff.id,
      decisionInputSchema.parse({
        decision: "approved",
        expectedDecisionId: null,
        acceptances: [{ readingId: oot.readingId, justification }],
      }),
    );
    expect(ok).toMatchObject({ ok: true, accepted: 1 });
    if (!ok.ok) throw new Error("unexpected");

    const kept = await db.selectFrom("reading_acceptances").selectAll().where("measurement_id", "=", oot.readingId).execute();
    expect(kept).toEqual([
      expect.objectContaining({ decision_id: ok.decisionId, justification, accepted_by: users.sup.id, shop_id: fx.shopId }),
    ]);
    const [entry] = await audits(fx.workOrderId, "review.approve").then((a) => a.filter((x) => x.outcome === "accepted"));
    expect((entry.detail as { acceptances: unknown[] }).acceptances).toEqual([
      { readingId: oot.readingId, reading: expect.stringContaining("Main 3"), justification },
    ]);
    const shown = await loadSignOffReview(db, users.office, signOff.id);
    expect(shown!.outOfTolerance[0].acceptance).toMatchObject({ justification, by: { id: users.sup.id } });

    // Decisions and acceptances are final records: the database refuses edits and deletions.
    await expect(sql`UPDATE reading_acceptances SET justification = 'changed' WHERE id = ${kept[0].id}::uuid`.execute(db)).rejects.toThrow(
      /append-only/,
    );
    await expect(sql`DELETE FROM review_decisions WHERE id = ${ok.decisionId}::uuid`.execute(db)).rejects.toThrow(/append-only/);
  });

  it("nobody decides on their own sign-off, even a supervisor who worked the bench; the office may", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const tablet = new Tablet("lead-tab", users.sup.id, fx.workOrderId);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage);
    const merged = await sync(db, users.sup, tablet, ops);
    expect(merged.refused).toEqual([]);

    const review = await loadSignOffReview(db, users.sup, signOff.id);
    expect(review).toMatchObject({ mayDecide: false, whyNot: expect.stringMatching(/signed this stage off yourself/) });
    const own = await decideOnSignOff(
      db,
      users.sup,
      signOff.id,
      decisionInputSchema.parse({ decision: "approved", expectedDecisionId: null }),
    );
    expect(own).toMatchObject({
      ok: false,
      status: 403,
      reason: "You signed this stage off yourself: another supervisor or the office must review it.",
    });
    const refusedEntry = (await audits(fx.workOrderId, "review.approve"))[0];
    expect(refusedEntry).toMatchObject({ outcome: "refused", actor_id: users.sup.id, reason: expect.stringMatching(/yourself/) });
    expect(await db.selectFrom("review_decisions").select("id").where("sign_off_id", "=", signOff.id).execute()).toEqual([]);

    const office = await decideOnSignOff(
      db,
      users.office,
      signOff.id,
      decisionInputSchema.parse({ decision: "approved", expectedDecisionId: null }),
    );
    expect(office).toMatchObject({ ok: true });
  });

  it("a supervisor who recorded a reading out of tolerance on the stage may not let it stand; the office may", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const tablet = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    // the supervisor reads cylinder 2's ring gap on their own tablet (0.5 mm: out of tolerance); the mechanic does the rest and signs off
    const ringGap = Object.values(specs).find((s) => s.key === "top-ring-gap")!;
    const lead = new Tablet("lead-tab", users.sup.id, fx.workOrderId);
    const supReading = lead.read(ringGap.stepId, ringGap.id, 1, 0.5);
    await sync(db, users.sup, lead, [supReading]);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage);
    await sync(
      db,
      users.mech,
      tablet,
      ops.filter((o) => !(o.kind === "measurement.recorded" && o.payload.specId === ringGap.id && o.payload.readingIndex === 1)),
    );
    const review = await loadSignOffReview(db, users.sup, signOff.id);
    expect(review?.outOfTolerance.map((o) => o.readingId)).toEqual([supReading.id]);
    const letStand = decisionInputSchema.parse({
      decision: "approved",
      expectedDecisionId: null,
      acceptances: [{ readingId: supReading.id, justification: "Ring maker allows 0.50 mm for this bore size" }],
    });
    const own = await decideOnSignOff(db, users.sup, signOff.id, letStand);
    expect(own).toMatchObject({
      ok: false,
      status: 422,
      issues: [
        {
          path: "acceptances.0.readingId",
          message: expect.stringMatching(
            /^You recorded Top ring gap, Cyl 2: 0\.5 mm .* yourself: another supervisor or the office must let it stand\.$/,
          ),
        },
      ],
    });
    expect(await db.selectFrom("reading_acceptances").select("id").where("measurement_id", "=", supReading.id).execute()).toEqual([]);
    expect(await decideOnSignOff(db, users.office, signOff.id, letStand)).toMatchObject({ ok: true, decision: "approved" });
  });

  it("mechanics and customers may not decide (403), another shop gets 404, and a stale view cannot overwrite a decision (409)", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const other = await reviewSetup(db);
    const tablet = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage);
    await sync(db, users.mech, tablet, ops);
    const approve = decisionInputSchema.parse({ decision: "approved", expectedDecisionId: null });

    expect(await decideOnSignOff(db, users.mech2, signOff.id, approve)).toMatchObject({
      ok: false,
      status: 403,
      reason: "Your role (mechanic) may not approve or send back work.",
    });
    expect(await decideOnSignOff(db, users.customer, signOff.id, approve)).toMatchObject({
      ok: false,
      status: 403,
      reason: "Your role (customer) may not approve or send back work.",
    });
    expect(await decideOnSignOff(db, other.users.sup, signOff.id, approve)).toMatchObject({ ok: false, status: 404 });
    expect(await loadSignOffReview(db, other.users.sup, signOff.id)).toBeNull();
    expect((await queue(other.fx.shopId)).total).toBe(0);

    const first = await decideOnSignOff(db, users.sup, signOff.id, approve);
    expect(first.ok).toBe(true);
    // The office looked at the screen before the supervisor's approval and now sends it back: refused.
    const late = await decideOnSignOff(
      db,
      users.office,
      signOff.id,
      decisionInputSchema.parse({
        decision: "sent_back",
        expectedDecisionId: null,
        reason: "Bore readings look odd",
        reopenStepIds: [stepIds[0]],
      }),
    );
    expect(late).toMatchObject({ ok: false, status: 409, reason: expect.stringMatching(/Someone else decided/) });
    // Knowing the standing decision, a later decision supersedes it (a new row; the old one stays).
    if (!first.ok) throw new Error("unexpected");
    const later = await decideOnSignOff(
      db,
      users.office,
      signOff.id,
      decisionInputSchema.parse({
        decision: "sent_back",
        expectedDecisionId: first.decisionId,
        reason: "Bore readings look odd",
        reopenStepIds: [stepIds[0]],
      }),
    );
    expect(later).toMatchObject({ ok: true, decision: "sent_back" });
    const rows = await db
      .selectFrom("review_decisions")
      .select(["decision"])
      .where("sign_off_id", "=", signOff.id)
      .orderBy("change_seq")
      .execute();
    expect(rows.map((r) => r.decision)).toEqual(["approved", "sent_back"]);
  });

  it("work on the stage that arrives while the review is open refuses a decision made on the older screen (409) until it is reloaded", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const tablet = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage);
    await sync(db, users.mech, tablet, ops);
    const screen = await loadSignOffReview(db, users.sup, signOff.id);
    if (!screen) throw new Error("no review");
    const seenOps = await db
      .selectFrom("operations")
      .select(sql<string>`max(seq)::text`.as("seq"))
      .where("work_order_id", "=", fx.workOrderId)
      .executeTakeFirstOrThrow();
    expect(screen.seenUpTo).toBe(seenOps.seq);
    const onScreen = (decision: "approved" | "sent_back", seenUpTo: string) =>
      decisionInputSchema.parse(
        decision === "approved"
          ? { decision, expectedDecisionId: null, seenUpTo }
          : { decision, expectedDecisionId: null, seenUpTo, reason: "Read the ring gap again", reopenStepIds: [stepIds[2]] },
      );

    // Work on another stage of the job (the bolts of the bottom end) does not touch what is under review.
    // (The same mechanic on a second tablet: work kept without a flag, which a supervisor would
    // otherwise approve unseen.)
    const second = new Tablet("bay-2", users.mech.id, fx.workOrderId);
    await sync(db, users.mech, second, [second.complete(fx.stepByKey["rod-bolts"].id)]);
    // A correction of cylinder 2's ring gap on the stage under review arrives while the screen is open.
    const ringGap = Object.values(specs).find((s) => s.key === "top-ring-gap")!;
    const original = ops.find((o) => o.kind === "measurement.recorded" && o.payload.specId === ringGap.id && o.payload.readingIndex === 1)!;
    const correction = second.read(ringGap.stepId, ringGap.id, 1, "0.43", { supersedesId: original.id });
    await sync(db, users.mech, second, [correction]);
    expect(await db.selectFrom("operations").select("flagged").where("id", "=", correction.id).executeTakeFirstOrThrow()).toEqual({
      flagged: false,
    });

    for (const decision of ["approved", "sent_back"] as const) {
      const stale = await decideOnSignOff(db, users.sup, signOff.id, onScreen(decision, screen.seenUpTo));
      expect(stale).toMatchObject({
        ok: false,
        status: 409,
        reason:
          'While you had this review open, 1 new entry (Reading: 0.43 mm (a correction)) arrived on "Measure before assembly". Reload to see it before you decide.',
      });
    }
    expect(await db.selectFrom("review_decisions").select("id").where("sign_off_id", "=", signOff.id).execute()).toEqual([]);
    expect((await audits(fx.workOrderId, "review.approve")).map((a) => a.outcome)).toEqual(["refused"]);
    expect((await queue(fx.shopId)).total).toBe(1);

    // Reloaded, the screen shows the correction and the decision goes through.
    const reloaded = await loadSignOffReview(db, users.sup, signOff.id);
    if (!reloaded) throw new Error("no review");
    expect(BigInt(reloaded.seenUpTo)).toBeGreaterThan(BigInt(screen.seenUpTo));
    const ringGapStep = reloaded.steps.find((s) => s.id === ringGap.stepId)!;
    expect(JSON.stringify(ringGapStep)).toContain("0.43");
    const approved = await decideOnSignOff(db, users.sup, signOff.id, onScreen("approved", reloaded.seenUpTo));
    expect(approved).toMatchObject({ ok: true });
    expect((await queue(fx.shopId)).total).toBe(0);
  });

  it("filters and sorts the queue on the server: by job, bike, mechanic and readings out of tolerance", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const t1 = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    await sync(db, users.mech, t1, measureStageWork(t1, specs, stepIds, stage, { "bore-1:0": 76.03 }).ops);
    // the second mechanic signs off the head procedure's first stage (no readings out of tolerance)
    await db.updateTable("work_orders").set({ assigned_mechanic_id: null }).where("id", "=", fx.workOrderId).execute();
    const t2 = new Tablet("bay-2", users.mech2.id, fx.workOrderId);
    const headStage = { jobProcedureId: fx.procedures[1].id, stageKey: "head-prep" };
    const headOff = t2.make("stage.signed-off", headStage);
    await sync(db, users.mech2, t2, [headOff]);

    const all = await queue(fx.shopId);
    expect(all.rows.map((r) => r.stageKey)).toEqual(["head-prep", "measure"]); // newest first
    expect((await queue(fx.shopId, { sort: "signed", dir: "asc" })).rows.map((r) => r.stageKey)).toEqual(["measure", "head-prep"]);
    expect((await queue(fx.shopId, { outOfTolerance: "yes" })).rows.map((r) => r.stageKey)).toEqual(["measure"]);
    expect((await queue(fx.shopId, { outOfTolerance: "no" })).rows.map((r) => r.stageKey)).toEqual(["head-prep"]);
    expect((await queue(fx.shopId, { mechanic: users.mech2.id })).rows.map((r) => r.signOffId)).toEqual([headOff.id]);
    expect((await queue(fx.shopId, { job: "1" })).total).toBe(2);
    expect((await queue(fx.shopId, { job: "2" })).total).toBe(0);
    expect((await queue(fx.shopId, { q: "FX-" })).total).toBe(2);
    expect((await queue(fx.shopId, { q: "Halden" })).total).toBe(0);
    expect((await queue(fx.shopId, { size: "1", page: "1" })).rows.map((r) => r.stageKey)).toEqual(["measure"]);
    expect(queueQuerySchema.safeParse({ job: "12a" }).error?.issues[0].message).toBe("The job must be a work order number");
  });
});
