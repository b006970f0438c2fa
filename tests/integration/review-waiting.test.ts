import { describe, expect, it } from "vitest";
import { decideOnSignOff } from "@/db/review/decide";
import { loadSignOffReview } from "@/db/review/detail";
import { countReviewQueue, pageReviewQueue, type QueueSource } from "@/db/review/queue";
import { decisionInputSchema } from "@/lib/review/decision-input";
import { queueQuerySchema } from "@/lib/review/list-queries";
import { Tablet } from "../bench/sync-ops";
import { GOOD, measureStageWork, reviewSetup, sync } from "./support/review-bench";
import { useTestDb } from "./support/test-db";

// The review queue reads the small table of what waits (review_waiting, kept by triggers). Here it
// must agree, after every kind of change, with the same queue worked out from the whole history.

const db = useTestDb();

async function queueFrom(shopId: string, source: QueueSource) {
  const page = (q: Record<string, string>) => pageReviewQueue(db, shopId, queueQuerySchema.parse({ size: "100", ...q }), source);
  return {
    all: await page({}),
    outOfTolerance: await page({ outOfTolerance: "yes" }),
    inTolerance: await page({ outOfTolerance: "no" }),
    byJob: await page({ sort: "job", dir: "asc" }),
    // a page past the end: no rows, and still the number of matches
    pastEnd: await page({ page: "40" }),
    count: await countReviewQueue(db, shopId, source),
  };
}

/** The queue from the waiting table equals the queue from history; returns it. */
async function expectAgreement(shopId: string) {
  const fromTable = await queueFrom(shopId, "waiting");
  expect(fromTable).toEqual(await queueFrom(shopId, "history"));
  expect(fromTable.pastEnd).toEqual({ rows: [], total: fromTable.count });
  expect(fromTable.all.total).toBe(fromTable.count);
  return fromTable;
}

const approve = (
  acceptances: { readingId: string; justification: string }[],
  flagAcceptances: { operationId: string; justification: string }[],
) => decisionInputSchema.parse({ decision: "approved", expectedDecisionId: null, acceptances, flagAcceptances });

describe("the table of what waits for review agrees with the full history", () => {
  it("after sign-offs, a send-back, a redo, a withdrawn sign-off, an approval with a reading let stand, and a reading out of tolerance after approval", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const tablet = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    const ringGap = specs["top-ring-gap"];

    // nothing signed off: nothing waits
    expect((await expectAgreement(fx.shopId)).count).toBe(0);

    // a sign-off with a ring gap over the limit waits, out of tolerance
    const first = measureStageWork(tablet, specs, stepIds, stage, { "top-ring-gap:1": 0.5 });
    await sync(db, users.mech, tablet, first.ops);
    let q = await expectAgreement(fx.shopId);
    expect(q.all.rows).toEqual([expect.objectContaining({ signOffId: first.signOff.id, outOfTolerance: 1, resubmitted: false })]);
    expect(q.outOfTolerance.total).toBe(1);
    expect(q.inTolerance.total).toBe(0);

    // sent back: the stage waits for a new sign-off, not for the supervisor
    const sent = await decideOnSignOff(
      db,
      users.sup,
      first.signOff.id,
      decisionInputSchema.parse({
        decision: "sent_back",
        expectedDecisionId: null,
        reason: "Regap the ring of cylinder 2",
        reopenStepIds: [ringGap.stepId],
      }),
    );
    expect(sent.ok).toBe(true);
    expect((await expectAgreement(fx.shopId)).count).toBe(0);

    // the redo: a corrected reading and a new sign-off wait again, marked as after a send-back
    const bad = await db
      .selectFrom("measurements")
      .select("id")
      .where("work_order_id", "=", fx.workOrderId)
      .where("spec_id", "=", ringGap.id)
      .where("reading_index", "=", 1)
      .executeTakeFirstOrThrow();
    const redo = [
      tablet.read(ringGap.stepId, ringGap.id, 1, GOOD["top-ring-gap"], { supersedesId: bad.id }),
      tablet.complete(ringGap.stepId),
    ];
    const second = tablet.make("stage.signed-off", stage);
    await sync(db, users.mech, tablet, [...redo, second]);
    q = await expectAgreement(fx.shopId);
    expect(q.all.rows).toEqual([expect.objectContaining({ signOffId: second.id, outOfTolerance: 0, resubmitted: true })]);

    // the mechanic withdraws that sign-off: the newest standing one was sent back, so nothing waits
    await sync(db, users.mech, tablet, [
      tablet.make("entry.withdrawn", { operationId: second.id, reason: "Signed off before the gap check" }),
    ]);
    expect((await expectAgreement(fx.shopId)).count).toBe(0);

    // the redo's completion was made before the tablet heard of the send-back: kept and flagged
    // signed off again with the main bearing clearance high: waits; approved with the reading let
    // stand and the flagged completion accepted: gone
    const third = tablet.make("stage.signed-off", stage);
    const main = specs["main-oil-clearance"];
    await sync(db, users.mech, tablet, [tablet.read(main.stepId, main.id, 2, 0.046), third]);
    q = await expectAgreement(fx.shopId);
    expect(q.outOfTolerance.rows).toEqual([expect.objectContaining({ signOffId: third.id, outOfTolerance: 1 })]);
    const review = await loadSignOffReview(db, users.sup, third.id);
    const [oot] = review!.outOfTolerance;
    expect(review!.flagged.length).toBeGreaterThan(0);
    const approved = await decideOnSignOff(
      db,
      users.sup,
      third.id,
      approve(
        [{ readingId: oot.readingId, justification: "Shell maker allows 0.048 mm for this grade" }],
        review!.flagged.map((f) => ({ operationId: f.operationId, justification: "Regapped as asked; the send-back crossed with it" })),
      ),
    );
    expect(approved, JSON.stringify(approved)).toMatchObject({ ok: true });
    expect((await expectAgreement(fx.shopId)).count).toBe(0);

    // after approval a new reading out of tolerance arrives: the stage is back for another look (the
    // reading is out of tolerance, and, recorded after the approval, flagged, which the row names first)
    const late = await sync(db, users.mech, tablet, [tablet.read(main.stepId, main.id, 0, 0.05)]);
    expect(late.flagged[0].reason).toMatch(/after the supervisor approved its stage/);
    q = await expectAgreement(fx.shopId);
    expect(q.all.rows).toEqual([expect.objectContaining({ signOffId: third.id, outOfTolerance: 1, backAfterApproval: "flagged" })]);
    expect(await db.selectFrom("review_waiting").select(["sign_off_id", "stage_key"]).where("shop_id", "=", fx.shopId).execute()).toEqual([
      { sign_off_id: third.id, stage_key: "measure" },
    ]);

    // a second mechanic, not assigned to the job, completes a step of the stage: kept and flagged;
    // the stage's flagged entry nobody has accepted is read beside the table, and still agrees
    const other = new Tablet("bay-2", users.mech2.id, fx.workOrderId);
    const merged = await sync(db, users.mech2, other, [other.complete(ringGap.stepId)]);
    expect(merged.flagged).toHaveLength(1);
    q = await expectAgreement(fx.shopId);
    expect(q.all.rows).toEqual([expect.objectContaining({ signOffId: third.id, backAfterApproval: "flagged" })]);
  });

  it("two tablets, two mechanics, another shop: each shop's table holds its own, and agrees", async () => {
    const a = await reviewSetup(db);
    const b = await reviewSetup(db);
    const ta = new Tablet("bay-1", a.users.mech.id, a.fx.workOrderId);
    const tb = new Tablet("bay-2", b.users.mech2.id, b.fx.workOrderId);
    await sync(db, a.users.mech, ta, measureStageWork(ta, a.specs, a.stepIds, a.stage).ops);
    await sync(db, b.users.mech2, tb, measureStageWork(tb, b.specs, b.stepIds, b.stage, { "bore-1:0": 76.2 }).ops);
    expect((await expectAgreement(a.fx.shopId)).all.rows).toEqual([expect.objectContaining({ outOfTolerance: 0 })]);
    expect((await expectAgreement(b.fx.shopId)).all.rows).toEqual([expect.objectContaining({ outOfTolerance: 1 })]);
  });
});
