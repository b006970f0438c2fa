import { describe, expect, it } from "vitest";
import { loadBuildProgress } from "@/db/records/build-progress";
import { decideOnSignOff } from "@/db/review/decide";
import { decisionInputSchema } from "@/lib/review/decision-input";
import { Tablet } from "../bench/sync-ops";
import { measureStageWork, reviewSetup, sync } from "./support/review-bench";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

describe("build progress for the office, from the synced bench record", () => {
  it("follows a stage through sign-off, send-back, redo and approval, and says when the job's state is due to move", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const measure = async () => (await loadBuildProgress(db, users.office, fx.workOrderId))!.stages.find((s) => s.key === "measure")!;

    const fresh = (await loadBuildProgress(db, users.office, fx.workOrderId))!;
    expect(fresh.stepsDone).toBe(0);
    expect(fresh.stages.every((s) => s.state === "not_started")).toBe(true);
    expect(fresh.due).toBeNull();

    const tablet = new Tablet("bay-3", users.mech.id, fx.workOrderId);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage, { "top-ring-gap:1": 0.5 });
    await sync(db, users.mech, tablet, ops);
    expect(await measure()).toMatchObject({ state: "waiting_review", stepsDone: 4, stepsTotal: 4, outOfTolerance: 1 });
    const waiting = (await loadBuildProgress(db, users.office, fx.workOrderId))!;
    expect(waiting.due).toMatchObject({ to: "in_review" });
    expect(waiting.outOfTolerance).toBe(1);

    const ringGap = fx.stepByKey["ring-gap"].id;
    const reason = "Regap cylinder 2 and read it again";
    const sent = await decideOnSignOff(
      db,
      users.sup,
      signOff.id,
      decisionInputSchema.parse({ decision: "sent_back", expectedDecisionId: null, reason, reopenStepIds: [ringGap] }),
    );
    if (!sent.ok) throw new Error(sent.reason);
    expect(await measure()).toMatchObject({ state: "sent_back", reason, stepsDone: 3, signedOffAt: null });

    const high = (
      await db
        .selectFrom("measurements")
        .select("id")
        .where("spec_id", "=", specs["top-ring-gap"].id)
        .where("reading_index", "=", 1)
        .executeTakeFirstOrThrow()
    ).id;
    // the tablet hears of the send-back first, so its redo is a redo (sync rule 7), not flagged work
    await sync(db, users.mech, tablet);
    const again = tablet.make("stage.signed-off", stage);
    await sync(db, users.mech, tablet, [
      tablet.read(ringGap, specs["top-ring-gap"].id, 1, 0.44, { supersedesId: high }),
      tablet.complete(ringGap),
      again,
    ]);
    expect(await measure()).toMatchObject({ state: "waiting_review", stepsDone: 4, outOfTolerance: 0 });

    const ok = await decideOnSignOff(
      db,
      users.sup,
      again.id,
      decisionInputSchema.parse({ decision: "approved", expectedDecisionId: null }),
    );
    expect(ok).toMatchObject({ ok: true });
    const done = (await loadBuildProgress(db, users.office, fx.workOrderId))!;
    expect(done.stages.find((s) => s.key === "measure")).toMatchObject({ state: "approved", reason: null });
    expect(done.approvedStages).toBe(1);
    // Other stages of the job are still to do, so no move is due yet.
    expect(done.stages.length).toBeGreaterThan(1);
    expect(done.due).toBeNull();
  });

  it("is null for a work order of another shop", async () => {
    const { fx } = await reviewSetup(db);
    const other = await createShopFixture(db);
    expect(await loadBuildProgress(db, { ...other.users.office, customerId: null }, fx.workOrderId)).toBeNull();
  });
});
