import { randomUUID } from "node:crypto";
import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

const asUser = (u: ShopFixture["users"]["mechanic"]): SessionUser => ({ ...u, role: u.role, customerId: null });

async function setup() {
  const fx = await createShopFixture(db);
  const specs = await fixtureSpecs(db, fx);
  const mech = asUser(fx.users.mechanic);
  return { fx, specs, mech, tablet: new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId) };
}

/** Rows a merge writes for one job, in a comparable form (ids and values, not receive times or seq). */
async function jobState(workOrderId: string) {
  const q = async (table: string, cols: string) =>
    (await sql.raw<Record<string, unknown>>(`SELECT ${cols} FROM ${table} WHERE work_order_id = '${workOrderId}' ORDER BY id`).execute(db))
      .rows;
  return {
    operations: await q("operations", "id, kind, stamp, flagged, flag_reason"),
    completions: await q("step_completions", "id, step_id, flagged"),
    measurements: await q("measurements", "id, spec_id, reading_index, value::text AS value, unit, verdict, supersedes_id"),
    torque: await q("torque_records", "id, pass_index, bolt"),
    timers: await q("timers", "id, started_at, stopped_at"),
    signOffs: await q("sign_offs", "id, stage_key"),
    attachments: await q("attachments", "id, object_key, awaiting_upload"),
    audit: await q("audit_log", "entity_id, outcome, reason"),
  };
}

describe("merging a batch", () => {
  it("writes each kind into its table, keeping reading values exactly as sent", async () => {
    const { fx, specs, mech, tablet } = await setup();
    const timerId = randomUUID();
    const photoId = randomUUID();
    const ops = [
      tablet.read(specs.boreStepId, specs.boreSpecId, 0, 76.00512345678901),
      tablet.read(specs.boreStepId, specs.boreSpecId, 1, 2.9925, { unit: "in" }),
      tablet.read(specs.boreStepId, specs.boreSpecId, 2, 76.02),
      tablet.bolt(specs.rodStepId, specs.rodSpecId, 3, 2),
      tablet.make("timer.started", {
        timerId,
        stepId: specs.cureStepId,
        timerSpecId: specs.cureTimerSpecId,
        label: "Sealant cure",
        durationS: 1800,
        startedAt: new Date(Date.now() - 60_000).toISOString(),
      }),
      tablet.make("timer.stopped", { timerId, stoppedAt: new Date().toISOString() }),
      tablet.make("photo.queued", {
        attachmentId: photoId,
        stepId: specs.boreStepId,
        contentType: "image/jpeg",
        byteSize: 123_456,
        caption: "Bore at top",
      }),
      tablet.complete(specs.boreStepId),
      tablet.make("stage.signed-off", specs.measureStage),
    ];
    const res = await mergeBatch(db, mech, tablet.batch(ops));
    expect(res.refused).toEqual([]);
    expect(res.accepted).toEqual(ops.map((o) => o.id));

    const m = await db
      .selectFrom("measurements")
      .select(["id", sql<string>`value::text`.as("v"), "unit", "verdict"])
      .where("work_order_id", "=", fx.workOrderId)
      .orderBy("reading_index")
      .execute();
    expect(m.map((r) => [r.v, r.unit, r.verdict])).toEqual([
      ["76.00512345678901", "mm", "in"],
      ["2.9925", "in", "in"],
      ["76.02", "mm", "high"],
    ]);
    const timer = await db.selectFrom("timers").selectAll().where("id", "=", timerId).executeTakeFirstOrThrow();
    expect(timer.stopped_at).not.toBeNull();
    expect(timer.started_by).toBe(mech.id);
    const photo = await db.selectFrom("attachments").selectAll().where("id", "=", photoId).executeTakeFirstOrThrow();
    expect(photo).toMatchObject({
      awaiting_upload: true,
      byte_size: 123_456,
      caption: "Bore at top",
      step_id: specs.boreStepId,
      purpose: "step",
      bike_id: fx.bike.id,
    });
    expect(await db.selectFrom("sign_offs").select("stage_key").where("work_order_id", "=", fx.workOrderId).execute()).toEqual([
      { stage_key: "measure" },
    ]);
    expect(
      await db.selectFrom("torque_records").select(["pass_index", "bolt"]).where("work_order_id", "=", fx.workOrderId).execute(),
    ).toEqual([{ pass_index: 3, bolt: 2 }]);
  });

  it("treats a replayed batch as duplicates and leaves the database as if it came once", async () => {
    const { fx, specs, mech, tablet } = await setup();
    const ops = [
      tablet.read(specs.boreStepId, specs.boreSpecId, 0, 76.001),
      tablet.bolt(specs.rodStepId, specs.rodSpecId, 1, 1),
      tablet.complete(specs.rodStepId),
    ];
    const batch = tablet.batch(ops);
    const first = await mergeBatch(db, mech, batch);
    expect(first.accepted).toHaveLength(3);
    const before = await jobState(fx.workOrderId);
    const again = await mergeBatch(db, mech, batch);
    expect(again.accepted).toEqual([]);
    expect(again.duplicates.sort()).toEqual(ops.map((o) => o.id).sort());
    expect(await jobState(fx.workOrderId)).toEqual(before);
  });

  it("after a batch cut off half-way, the retry of the whole outbox ends as one clean arrival", async () => {
    const { fx, specs, mech, tablet } = await setup();
    const ops = Array.from({ length: 10 }, (_, i) => tablet.read(specs.boreStepId, specs.boreSpecId, i % 6, 76 + i / 1000));
    // the first half arrived (the answer was lost); the tablet then resends everything
    await mergeBatch(db, mech, tablet.batch(ops.slice(0, 5)));
    const retry = await mergeBatch(db, mech, tablet.batch(ops));
    expect(retry.duplicates.sort()).toEqual(
      ops
        .slice(0, 5)
        .map((o) => o.id)
        .sort(),
    );
    expect(retry.accepted).toEqual(ops.slice(5).map((o) => o.id));

    // the same outbox in one go on a twin job gives the same rows
    const twin = await setup();
    const twinOps = ops.map((o) => ({
      ...o,
      id: randomUUID(),
      workOrderId: twin.fx.workOrderId,
      authorId: twin.mech.id,
      payload: { ...o.payload, stepId: twin.specs.boreStepId, specId: twin.specs.boreSpecId },
    }));
    await mergeBatch(db, twin.mech, { deviceId: tablet.deviceId, cursor: null, operations: twinOps });
    const count = async (wo: string) => (await db.selectFrom("measurements").select("id").where("work_order_id", "=", wo).execute()).length;
    const audits = async (wo: string) =>
      (await db.selectFrom("audit_log").select("entity_id").where("work_order_id", "=", wo).execute()).length;
    expect(await count(fx.workOrderId)).toBe(10);
    expect(await count(fx.workOrderId)).toBe(await count(twin.fx.workOrderId));
    expect(await audits(fx.workOrderId)).toBe(await audits(twin.fx.workOrderId));
  });

  it("orders by stamp, not arrival: reordered batches give the same current readings", async () => {
    const a = await setup();
    const b = await setup();
    // two tablets on each job take the same readings at interleaved times
    const run = (s: Awaited<ReturnType<typeof setup>>, sup: SessionUser) => {
      let t = Date.now() - 10_000;
      const clock = () => (t += 100);
      const t1 = new Tablet("tab-one", s.mech.id, s.fx.workOrderId, clock);
      const t2 = new Tablet("tab-two", sup.id, s.fx.workOrderId, clock);
      const one = [t1.read(s.specs.boreStepId, s.specs.boreSpecId, 0, 76.001)];
      const two = [t2.read(s.specs.boreStepId, s.specs.boreSpecId, 0, 76.004)];
      const oneLater = [t1.read(s.specs.boreStepId, s.specs.boreSpecId, 1, 76.006)];
      return { t1, t2, one, two, oneLater };
    };
    const supA = asUser(a.fx.users.supervisor);
    const supB = asUser(b.fx.users.supervisor);
    const ra = run(a, supA);
    const rb = run(b, supB);
    await mergeBatch(db, a.mech, ra.t1.batch([...ra.one, ...ra.oneLater]));
    await mergeBatch(db, supA, ra.t2.batch(ra.two));
    // on job B the later batches come first
    await mergeBatch(db, supB, rb.t2.batch(rb.two));
    await mergeBatch(db, b.mech, rb.t1.batch(rb.oneLater));
    await mergeBatch(db, b.mech, rb.t1.batch(rb.one));

    const current = async (wo: string) =>
      (
        await db
          .selectFrom("current_measurements")
          .select(["reading_index", sql<string>`value::text`.as("v")])
          .where("work_order_id", "=", wo)
          .orderBy("reading_index")
          .execute()
      ).map((r) => [r.reading_index, r.v]);
    // index 0: tablet two's reading has the later stamp
    expect(await current(a.fx.workOrderId)).toEqual([
      [0, "76.004"],
      [1, "76.006"],
    ]);
    expect(await current(b.fx.workOrderId)).toEqual(await current(a.fx.workOrderId));
    const all = await db.selectFrom("measurements").select("id").where("work_order_id", "=", b.fx.workOrderId).execute();
    expect(all).toHaveLength(3);
  });

  it("keeps both tablets' readings when they sync the same job at the same moment", async () => {
    const { fx, specs, mech } = await setup();
    const sup = asUser(fx.users.supervisor);
    const t1 = new Tablet("bay-1", mech.id, fx.workOrderId);
    const t2 = new Tablet("bay-2", sup.id, fx.workOrderId);
    const ops1 = Array.from({ length: 200 }, (_, i) => t1.read(specs.boreStepId, specs.boreSpecId, i % 6, 76 + (i % 7) / 1000));
    const ops2 = Array.from({ length: 200 }, (_, i) => t2.read(specs.boreStepId, specs.boreSpecId, i % 6, 76.01 + (i % 3) / 1000));
    const [r1, r2] = await Promise.all([mergeBatch(db, mech, t1.batch(ops1)), mergeBatch(db, sup, t2.batch(ops2))]);
    expect(r1.accepted).toHaveLength(200);
    expect(r2.accepted).toHaveLength(200);
    const rows = await db.selectFrom("measurements").select(["id", "device_id"]).where("work_order_id", "=", fx.workOrderId).execute();
    expect(rows.filter((r) => r.device_id === "bay-1")).toHaveLength(200);
    expect(rows.filter((r) => r.device_id === "bay-2")).toHaveLength(200);
    // whichever merged second sees the other's readings as changes
    const [firstDone, secondDone] = Number(r1.cursor) < Number(r2.cursor) ? [r1, r2] : [r2, r1];
    expect(secondDone.changes.filter((c) => c.type === "operation")).toHaveLength(200);
    expect(firstDone.changes).toEqual([]);
  });

  it("keeps a corrected reading and makes the correction current", async () => {
    const { fx, specs, mech, tablet } = await setup();
    const wrong = tablet.read(specs.boreStepId, specs.boreSpecId, 3, 67.009, { note: "digits swapped" });
    await mergeBatch(db, mech, tablet.batch([wrong]));
    const fix = tablet.read(specs.boreStepId, specs.boreSpecId, 3, 76.009, { supersedesId: wrong.id });
    const res = await mergeBatch(db, mech, tablet.batch([fix]));
    expect(res.accepted).toEqual([fix.id]);
    const rows = await db
      .selectFrom("measurements")
      .select(["id", "supersedes_id", "verdict"])
      .where("work_order_id", "=", fx.workOrderId)
      .where("reading_index", "=", 3)
      .execute();
    expect(rows).toHaveLength(2);
    expect(rows.find((r) => r.id === wrong.id)).toMatchObject({ verdict: "low", supersedes_id: null });
    expect(rows.find((r) => r.id === fix.id)).toMatchObject({ verdict: "in", supersedes_id: wrong.id });
    const current = await db
      .selectFrom("current_measurements")
      .select("id")
      .where("work_order_id", "=", fx.workOrderId)
      .where("reading_index", "=", 3)
      .execute();
    expect(current).toEqual([{ id: fix.id }]);
    // and the old one cannot be changed or removed
    await expect(sql`UPDATE measurements SET value = 1 WHERE id = ${wrong.id}::uuid`.execute(db)).rejects.toThrow(/append-only/);
  });

  it("keeps the earliest stop of a timer when two tablets stop it", async () => {
    const { fx, specs, mech } = await setup();
    const sup = asUser(fx.users.supervisor);
    const t1 = new Tablet("bay-1", mech.id, fx.workOrderId);
    const t2 = new Tablet("bay-2", sup.id, fx.workOrderId);
    const timerId = randomUUID();
    const start = Date.now() - 600_000;
    await mergeBatch(
      db,
      mech,
      t1.batch([
        t1.make("timer.started", {
          timerId,
          stepId: specs.cureStepId,
          label: "Cure",
          durationS: 300,
          startedAt: new Date(start).toISOString(),
        }),
      ]),
    );
    const late = new Date(start + 400_000).toISOString();
    const early = new Date(start + 310_000).toISOString();
    await mergeBatch(db, sup, t2.batch([t2.make("timer.stopped", { timerId, stoppedAt: late })]));
    await mergeBatch(db, mech, t1.batch([t1.make("timer.stopped", { timerId, stoppedAt: early })]));
    const timer = await db.selectFrom("timers").select("stopped_at").where("id", "=", timerId).executeTakeFirstOrThrow();
    expect(timer.stopped_at?.toISOString()).toBe(early);
  });
});
