import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

const asUser = (u: ShopFixture["users"]["mechanic"]): SessionUser => ({ ...u, customerId: null });

async function setup(status?: Parameters<typeof createShopFixture>[1]) {
  const fx = await createShopFixture(db, status);
  const specs = await fixtureSpecs(db, fx);
  const mech = asUser(fx.users.mechanic);
  return { fx, specs, mech, tablet: new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId) };
}

const auditFor = (ids: string[]) =>
  db
    .selectFrom("audit_log")
    .select(["entity_id", "outcome", "reason", "actor_id", "device_id", "work_order_id", "action", "detail"])
    .where("entity_id", "in", ids)
    .orderBy("id")
    .execute();

describe("authorisation, per operation", () => {
  it("refuses an operation with a forged author, with the reason, and keeps the honest ones", async () => {
    const { fx, specs, mech, tablet } = await setup();
    const honest = tablet.complete(specs.boreStepId);
    const forged = tablet.complete(specs.rodStepId, { authorId: fx.users.mechanic2.id });
    const res = await mergeBatch(db, mech, tablet.batch([honest, forged]));
    expect(res.accepted).toEqual([honest.id]);
    expect(res.refused).toEqual([
      { id: forged.id, reason: expect.stringContaining(`names author ${fx.users.mechanic2.id}, who is not the signed-in user`) },
    ]);
    expect(await db.selectFrom("operations").select("id").where("id", "=", forged.id).execute()).toEqual([]);
  });

  it("refuses operations on another shop's job", async () => {
    const mine = await setup();
    const theirs = await setup();
    const op = mine.tablet.complete(theirs.specs.boreStepId, { workOrderId: theirs.fx.workOrderId });
    const res = await mergeBatch(db, mine.mech, mine.tablet.batch([op]));
    expect(res.refused).toEqual([
      {
        id: op.id,
        reason: `Work order ${theirs.fx.workOrderId} is not in your shop. Discard this entry with a reason; record the work again on the job as it is now.`,
      },
    ]);
    expect(await db.selectFrom("step_completions").select("id").where("work_order_id", "=", theirs.fx.workOrderId).execute()).toEqual([]);
    // audited in the refusing user's shop, without a link to the other shop's job
    const [row] = await auditFor([op.id]);
    expect(row).toMatchObject({ outcome: "refused", work_order_id: null, actor_id: mine.mech.id });
  });

  it("refuses a step that is not on the job's pinned procedures", async () => {
    const { mech, tablet } = await setup();
    const other = await setup();
    const op = tablet.complete(other.specs.boreStepId);
    const res = await mergeBatch(db, mech, tablet.batch([op]));
    expect(res.refused[0]).toEqual({
      id: op.id,
      reason: expect.stringMatching(/^Step .* is not part of a procedure on work order #1\. Discard this entry/),
    });
  });

  it("keeps and flags the work of a mechanic who is not assigned to the job, naming who is; a supervisor may work it", async () => {
    const { fx, specs } = await setup();
    const mech2 = asUser(fx.users.mechanic2);
    const t2 = new Tablet("bay-9", mech2.id, fx.workOrderId);
    const op = t2.complete(specs.boreStepId);
    const res = await mergeBatch(db, mech2, t2.batch([op]));
    expect(res.refused).toEqual([]);
    expect(res.accepted).toEqual([op.id]);
    expect(res.flagged).toEqual([
      {
        id: op.id,
        reason: `Work order #1 is assigned to ${fx.users.mechanic.name}, not to the mechanic who recorded this; kept for the supervisor to check.`,
      },
    ]);
    // the one flag store: the operation row, with the completion written as usual
    expect(await db.selectFrom("operations").select(["flagged", "flag_reason"]).where("id", "=", op.id).executeTakeFirstOrThrow()).toEqual({
      flagged: true,
      flag_reason: res.flagged[0].reason,
    });
    const sup = asUser(fx.users.supervisor);
    const ts = new Tablet("bay-s", sup.id, fx.workOrderId);
    const sop = ts.complete(specs.boreStepId);
    expect((await mergeBatch(db, sup, ts.batch([sop]))).accepted).toEqual([sop.id]);
  });
});

describe("kept but flagged", () => {
  it("flags a completion of a step sent back since the tablet last synced, and accepts a redo", async () => {
    const { fx, specs, mech, tablet } = await setup();
    const signOff = tablet.make("stage.signed-off", specs.measureStage);
    const first = await mergeBatch(db, mech, tablet.batch([tablet.complete(specs.boreStepId), signOff]));
    tablet.cursor = first.cursor;

    // offline, the tablet completes the bore step again (say, an extra check) …
    const stale = tablet.complete(specs.boreStepId);
    // … while the supervisor sends the bore step back
    await new Promise((r) => setTimeout(r, 5));
    const decision = await db
      .insertInto("review_decisions")
      .values({
        sign_off_id: signOff.id,
        decision: "sent_back",
        reason: "Bore readings taken warm",
        reopened_step_ids: [specs.boreStepId],
        decided_by: fx.users.supervisor.id,
      })
      .returning(["id", "change_seq"])
      .executeTakeFirstOrThrow();
    expect(Number(decision.change_seq)).toBeGreaterThan(Number(first.cursor));

    const res = await mergeBatch(db, mech, tablet.batch([stale]));
    expect(res.accepted).toEqual([stale.id]);
    expect(res.flagged).toEqual([{ id: stale.id, reason: expect.stringContaining("Bore readings taken warm") }]);
    const row = await db
      .selectFrom("step_completions")
      .select(["flagged", "flag_reason"])
      .where("id", "=", stale.id)
      .executeTakeFirstOrThrow();
    expect(row.flagged).toBe(true);
    expect(row.flag_reason).toContain("was sent back");
    const opRow = await db.selectFrom("operations").select(["flagged", "flag_reason"]).where("id", "=", stale.id).executeTakeFirstOrThrow();
    expect(opRow).toEqual({ flagged: true, flag_reason: row.flag_reason });
    // the decision comes back to the tablet, naming the job whose fresh copy reopens the step
    expect(res.changes).toContainEqual(expect.objectContaining({ type: "review", id: decision.id, workOrderId: fx.workOrderId }));

    // having the decision now, the tablet redoes the step: not flagged
    tablet.cursor = res.cursor;
    const redo = tablet.complete(specs.boreStepId);
    const after = await mergeBatch(db, mech, tablet.batch([redo]));
    expect(after.accepted).toEqual([redo.id]);
    expect(after.flagged).toEqual([]);
  });

  it("keeps and flags work recorded on a closed job", async () => {
    const { specs, mech, tablet, fx } = await setup({ status: "handed_over" });
    const done = tablet.complete(specs.rodStepId);
    const reading = tablet.read(specs.boreStepId, specs.boreSpecId, 0, 76.003);
    const res = await mergeBatch(db, mech, tablet.batch([done, reading]));
    expect(res.accepted).toEqual([done.id, reading.id]);
    expect(res.flagged.map((f) => f.id)).toEqual([done.id, reading.id]);
    expect(res.flagged[0].reason).toBe("Work order #1 is closed (Handed over); kept for review.");
    const c = await db
      .selectFrom("step_completions")
      .select(["flagged", "flag_reason"])
      .where("work_order_id", "=", fx.workOrderId)
      .executeTakeFirstOrThrow();
    expect(c).toEqual({ flagged: true, flag_reason: "Work order #1 is closed (Handed over); kept for review." });
  });

  it("keeps and flags a completion on a job not yet open for bench work", async () => {
    const { specs, mech, tablet } = await setup({ status: "approved" });
    const done = tablet.complete(specs.rodStepId);
    const res = await mergeBatch(db, mech, tablet.batch([done]));
    expect(res.flagged).toEqual([{ id: done.id, reason: "Work order #1 is not open for bench work (Approved); kept for review." }]);
  });
});

describe("audit log", () => {
  it("records accepted and refused operations once, even when the batch is sent again", async () => {
    const { fx, specs, mech, tablet } = await setup();
    const ok = tablet.read(specs.boreStepId, specs.boreSpecId, 0, 76.002);
    const bad = tablet.read(specs.boreStepId, specs.boreSpecId, 9, 76.002);
    const batch = tablet.batch([ok, bad]);
    const res = await mergeBatch(db, mech, batch);
    expect(res.refused).toEqual([{ id: bad.id, reason: expect.stringContaining("Reading index 9 is out of range") }]);
    await mergeBatch(db, mech, batch);

    const rows = await auditFor([ok.id, bad.id]);
    expect(rows).toHaveLength(2);
    const accepted = rows.find((r) => r.entity_id === ok.id)!;
    const refused = rows.find((r) => r.entity_id === bad.id)!;
    expect(accepted).toMatchObject({
      outcome: "accepted",
      action: "sync.measurement.recorded",
      actor_id: mech.id,
      device_id: tablet.deviceId,
      work_order_id: fx.workOrderId,
      reason: null,
    });
    expect(refused).toMatchObject({ outcome: "refused", reason: res.refused[0].reason, work_order_id: fx.workOrderId });
    // nothing refused is lost: the whole operation is in the audit detail
    expect((refused.detail as { operation: unknown }).operation).toEqual(bad);
  });

  it("refuses reusing another user's operation id", async () => {
    const { fx, specs, mech, tablet } = await setup();
    const op = tablet.complete(specs.boreStepId);
    await mergeBatch(db, mech, tablet.batch([op]));
    const sup = asUser(fx.users.supervisor);
    const copy = { ...op, authorId: sup.id, deviceId: "bay-s", stamp: op.stamp.replace(tablet.deviceId, "bay-s") };
    const res = await mergeBatch(db, sup, { deviceId: "bay-s", cursor: null, operations: [copy] });
    expect(res.refused).toEqual([
      { id: op.id, reason: `Operation id ${op.id} is already used by another user's operation. Discard this entry with a reason.` },
    ]);
    expect(res.duplicates).toEqual([]);
  });
});
