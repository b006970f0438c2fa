import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { mergeBatch } from "@/db/sync/merge";
import { changesSince } from "@/db/sync/changes";
import type { SessionUser } from "@/lib/auth/session-user";
import { syncResponseSchema } from "@/lib/sync/changes";
import { compareStamps, createClock, receive, tick } from "@/lib/sync/hlc";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
const asUser = (u: ShopFixture["users"]["mechanic"]): SessionUser => ({ ...u, customerId: null });

async function setup() {
  const fx = await createShopFixture(db);
  const specs = await fixtureSpecs(db, fx);
  const mech = asUser(fx.users.mechanic);
  const sup = asUser(fx.users.supervisor);
  return { fx, specs, mech, sup, t1: new Tablet("bay-1", mech.id, fx.workOrderId), t2: new Tablet("bay-2", sup.id, fx.workOrderId) };
}

describe("changes and cursor", () => {
  it("brings a second device what the first one sent since its cursor, and not its own work", async () => {
    const { specs, mech, sup, t1, t2 } = await setup();
    const start = await mergeBatch(db, sup, t2.batch([]));
    t2.cursor = start.cursor;

    const sent = [t1.read(specs.boreStepId, specs.boreSpecId, 0, 76.003), t1.complete(specs.boreStepId)];
    const r1 = await mergeBatch(db, mech, t1.batch(sent));
    expect(r1.changes).toEqual([]);

    const own = t2.read(specs.boreStepId, specs.boreSpecId, 0, 76.005);
    const r2 = syncResponseSchema.parse(await mergeBatch(db, sup, t2.batch([own])));
    expect(r2.changes.map((c) => c.type === "operation" && c.id)).toEqual(sent.map((o) => o.id));
    // a change carries what the tablet uses (the job to fetch, the stamp for its clock), not the operation
    expect(r2.changes[0]).toEqual({
      type: "operation",
      seq: expect.any(String),
      id: sent[0].id,
      workOrderId: sent[0].workOrderId,
      stamp: sent[0].stamp,
    });
    expect(Number(r2.cursor)).toBeGreaterThan(Number(start.cursor));

    // nothing new: an empty change list and the same cursor
    const r3 = await mergeBatch(db, sup, t2.batch([], r2.cursor));
    expect(r3.changes).toEqual([]);
    expect(r3.cursor).toBe(r2.cursor);
  });

  it("brings a person the work another person recorded on the same tablet (each has their own store there)", async () => {
    const { fx, specs, mech, sup } = await setup();
    const shared = "bay-shared";
    const mine = new Tablet(shared, mech.id, fx.workOrderId);
    const theirs = new Tablet(shared, sup.id, fx.workOrderId);
    const start = await mergeBatch(db, mech, mine.batch([]));
    mine.cursor = start.cursor;
    const own = mine.complete(specs.rodStepId);
    await mergeBatch(db, mech, mine.batch([own], start.cursor));
    // the mechanic signs out; the supervisor signs in on the same tablet and records a reading
    const other = theirs.read(specs.boreStepId, specs.boreSpecId, 0, 76.004);
    await mergeBatch(db, sup, theirs.batch([other]));
    // the mechanic signs in again: the supervisor's reading comes, the mechanic's own work does not
    const back = syncResponseSchema.parse(await mergeBatch(db, mech, mine.batch([], start.cursor)));
    expect(back.changes.map((c) => c.type === "operation" && c.id)).toEqual([other.id]);
  });

  it("sends review decisions with their reopened steps, and a stamp later tablet work sorts after", async () => {
    const { fx, specs, mech, sup, t1, t2 } = await setup();
    const signOff = t1.make("stage.signed-off", specs.measureStage);
    const r1 = await mergeBatch(db, mech, t1.batch([signOff]));
    const d = await db
      .insertInto("review_decisions")
      .values({
        sign_off_id: signOff.id,
        decision: "sent_back",
        reason: "Ring gaps missing",
        reopened_step_ids: [specs.boreStepId, fx.stepByKey["ring-gap"].id],
        decided_by: sup.id,
      })
      .returning(["id", "change_seq"])
      .executeTakeFirstOrThrow();
    const r2 = await mergeBatch(db, mech, t1.batch([], r1.cursor));
    expect(r2.changes).toEqual([
      { type: "review", seq: String(d.change_seq), id: d.id, workOrderId: fx.workOrderId, stamp: expect.any(String) },
    ]);
    expect(r2.cursor).toBe(String(d.change_seq));
    const change = r2.changes[0];
    if (change.type !== "review") throw new Error("expected a review change");
    let clock = tick(createClock("bay-1"), Date.now() - 60_000).state;
    clock = receive(clock, change.stamp, Date.now() - 60_000).state;
    expect(compareStamps(tick(clock, Date.now() - 60_000).stamp, change.stamp)).toBe(1);
    // the other tablet sees the sign-off and the decision, in sequence order
    const r3 = await mergeBatch(db, sup, t2.batch([], null));
    expect(r3.changes.map((c) => c.type)).toEqual(["operation", "review"]);
  });

  it("never lets a cursor pass a review decision that is still being written", async () => {
    const { specs, mech, sup, t1 } = await setup();
    const signOff = t1.make("stage.signed-off", specs.measureStage);
    const first = await mergeBatch(db, mech, t1.batch([signOff]));
    let release!: () => void;
    const held = new Promise<void>((r) => (release = r));
    let written!: () => void;
    const decisionWritten = new Promise<void>((r) => (written = r));
    const reviewer = db.transaction().execute(async (trx) => {
      await trx
        .insertInto("review_decisions")
        .values({ sign_off_id: signOff.id, decision: "approved", reason: "", reopened_step_ids: [], decided_by: sup.id })
        .execute();
      written();
      await held; // the reviewer's transaction stays open
    });
    await decisionWritten;
    const merging = mergeBatch(db, mech, t1.batch([t1.complete(specs.rodStepId)], first.cursor));
    const early = await Promise.race([merging.then(() => "merged"), new Promise((r) => setTimeout(() => r("waiting"), 300))]);
    expect(early).toBe("waiting");
    release();
    await reviewer;
    const res = await merging;
    expect(res.changes).toEqual([expect.objectContaining({ type: "review", workOrderId: signOff.workOrderId })]);
  });

  it("pages a long backlog of changes with `more`, never skipping or repeating one", async () => {
    const { fx, specs, mech, t1 } = await setup();
    const ops = Array.from({ length: 25 }, (_, i) => t1.read(specs.boreStepId, specs.boreSpecId, i % 6, 76 + i / 1000));
    await mergeBatch(db, mech, t1.batch(ops));
    const seen: string[] = [];
    let cursor: number | null = null;
    let pages = 0;
    for (;;) {
      const page = await changesSince(db, fx.shopId, { deviceId: "bay-2", authorId: fx.users.supervisor.id }, cursor, 10);
      pages += 1;
      for (const c of page.changes) if (c.type === "operation") seen.push(c.id);
      cursor = Number(page.cursor);
      if (!page.more) break;
    }
    expect(pages).toBe(3);
    expect(seen).toEqual(ops.map((o) => o.id));
  });

  it("leaves out closed jobs and other shops", async () => {
    const a = await setup();
    const b = await setup();
    await mergeBatch(db, b.mech, b.t1.batch([b.t1.complete(b.specs.boreStepId)]));
    await mergeBatch(db, a.mech, a.t1.batch([a.t1.complete(a.specs.boreStepId)]));
    const before = await changesSince(db, a.fx.shopId, { deviceId: "bay-9", authorId: a.fx.users.supervisor.id }, null);
    expect(before.changes.map((c) => c.type === "operation" && c.workOrderId)).toEqual([a.fx.workOrderId]);
    await db.updateTable("work_orders").set({ status: "handed_over" }).where("id", "=", a.fx.workOrderId).execute();
    const after = await changesSince(db, a.fx.shopId, { deviceId: "bay-9", authorId: a.fx.users.supervisor.id }, null);
    expect(after.changes).toEqual([]);
  });

  it("answers a first sync (cursor null) from a new device with the job's history", async () => {
    const { specs, mech, t1 } = await setup();
    const op = t1.complete(specs.rodStepId);
    await mergeBatch(db, mech, t1.batch([op]));
    const fresh = new Tablet(`new-${randomUUID().slice(0, 4)}`, mech.id, t1.workOrderId);
    const r = await mergeBatch(db, mech, fresh.batch([], null));
    expect(r.changes.map((c) => c.type === "operation" && c.id)).toEqual([op.id]);
  });
});
