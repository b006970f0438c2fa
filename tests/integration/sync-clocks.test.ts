import { randomUUID } from "node:crypto";
import { sql } from "kysely";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as closeRoute } from "@/app/api/jobs/[id]/clocks/[clockId]/close/route";
import { GET as hoursRoute } from "@/app/api/jobs/[id]/hours/route";
import { closeForgottenClock, hoursOfJob } from "@/db/bench/clocks";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { formatStamp } from "@/lib/sync/hlc";
import type { Operation, OperationOf } from "@/lib/sync/operations";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

// Time at the bench on real PostgreSQL: clock-ons and clock-offs through the sync merge (one open
// clock per mechanic, a clock-off before its clock-on refused, a clock-off that arrives first held
// until its clock-on comes), a supervisor's close of a forgotten clock (append-only, who/when/why),
// and the hours per stage and per person against the quote's labour.

const db = useTestDb();
let fx: ShopFixture;
let mech: SessionUser;
let mech2: SessionUser;
let sup: SessionUser;
let number = 5000;

const T0 = Date.now() - 10 * 3_600_000;
const at = (min: number) => new Date(T0 + min * 60_000).toISOString();

beforeAll(async () => {
  fx = await createShopFixture(db);
  mech = { ...fx.users.mechanic, customerId: null };
  mech2 = { ...fx.users.mechanic2, customerId: null };
  sup = { ...fx.users.supervisor, customerId: null };
});

async function newJob(): Promise<{ id: string; number: number; jobProcedureId: string }> {
  const n = ++number;
  const wo = await db
    .insertInto("work_orders")
    .values({
      shop_id: fx.shopId,
      bike_id: fx.bike.id,
      number: n,
      title: `Clock job ${n}`,
      status: "in_build",
      intake_odometer_km: 1000,
      assigned_mechanic_id: null,
      closed_at: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  const jp = await db
    .insertInto("job_procedures")
    .values({ work_order_id: wo.id, template_version_id: fx.procedures[0].templateVersionId, position: 0 })
    .returning("id")
    .executeTakeFirstOrThrow();
  return { id: wo.id, number: n, jobProcedureId: jp.id };
}

let counter = 0;
function op<K extends "clock.on" | "clock.off">(
  user: SessionUser,
  jobId: string,
  kind: K,
  payload: OperationOf<K>["payload"],
  min: number,
): Operation {
  const device = `tab-${user.id.slice(0, 8)}`;
  const wallMs = T0 + min * 60_000;
  return {
    id: randomUUID(),
    kind,
    workOrderId: jobId,
    authorId: user.id,
    deviceId: device,
    deviceTime: new Date(wallMs).toISOString(),
    stamp: formatStamp({ wallMs, counter: counter++ % 1000, deviceId: device }),
    payload,
  } as Operation;
}
const send = (user: SessionUser, operations: Operation[]) =>
  mergeBatch(db, user, { deviceId: operations[0]?.deviceId ?? `tab-${user.id.slice(0, 8)}`, cursor: null, operations });

describe("clock-ons and clock-offs through the sync", () => {
  it("records a clock on and off exactly once, and the hours follow", async () => {
    const job = await newJob();
    const clockId = randomUUID();
    const on = op(mech, job.id, "clock.on", { clockId, startedAt: at(0), jobProcedureId: job.jobProcedureId, stageKey: "measure" }, 0);
    const off = op(mech, job.id, "clock.off", { clockId, endedAt: at(95) }, 95);
    expect((await send(mech, [on, off])).accepted.sort()).toEqual([on.id, off.id].sort());
    const again = await send(mech, [on, off]);
    expect(again.duplicates.sort()).toEqual([on.id, off.id].sort());
    expect(await db.selectFrom("bench_clocks").select("id").where("work_order_id", "=", job.id).execute()).toHaveLength(1);
    expect(await db.selectFrom("bench_clock_ends").select("id").where("work_order_id", "=", job.id).execute()).toHaveLength(1);
    const hours = await hoursOfJob(db, fx.shopId, job.id);
    expect(hours).toMatchObject({ totalMinutes: 95, running: false });
    expect(hours!.byStage).toEqual([{ key: `${job.jobProcedureId}|measure`, minutes: 95, running: false }]);
  });

  it("keeps one open clock per mechanic: a clock-on while another runs is kept, flagged, and ends the earlier one at its time", async () => {
    const a = await newJob();
    const b = await newJob();
    const first = randomUUID();
    const second = randomUUID();
    await send(mech2, [op(mech2, a.id, "clock.on", { clockId: first, startedAt: at(0) }, 0)]);
    const onB = op(mech2, b.id, "clock.on", { clockId: second, startedAt: at(50) }, 50);
    const res = await send(mech2, [onB]);
    expect(res.accepted).toEqual([onB.id]);
    expect(res.flagged).toEqual([{ id: onB.id, reason: expect.stringContaining(`still on the clock on work order #${a.number}`) }]);
    const onA = await hoursOfJob(db, fx.shopId, a.id);
    expect(onA!.spans).toEqual([expect.objectContaining({ id: first, endedBy: "next-clock-on", running: false })]);
    expect(onA!.totalMinutes).toBe(50);
    const onBHours = await hoursOfJob(db, fx.shopId, b.id);
    expect(onBHours!.spans).toEqual([expect.objectContaining({ id: second, running: true })]);
    // nothing was dropped: both clock-ons are on record
    expect(await db.selectFrom("bench_clocks").select("id").where("id", "in", [first, second]).execute()).toHaveLength(2);
    await send(mech2, [op(mech2, b.id, "clock.off", { clockId: second, endedAt: at(60) }, 60)]);
  });

  it("refuses a clock-off before its clock-on, with the times, and a clock-off of someone else's clock", async () => {
    const job = await newJob();
    const clockId = randomUUID();
    await send(mech, [op(mech, job.id, "clock.on", { clockId, startedAt: at(120) }, 120)]);
    const early = op(mech, job.id, "clock.off", { clockId, endedAt: at(100) }, 121);
    const res = await send(mech, [early]);
    expect(res.refused).toEqual([
      { id: early.id, reason: expect.stringMatching(/Clock-off at .* is before its clock-on at .*cannot end before it starts/) },
    ]);
    const other = op(mech2, job.id, "clock.off", { clockId, endedAt: at(130) }, 130);
    expect((await send(mech2, [other])).refused).toEqual([
      { id: other.id, reason: expect.stringContaining("Only the mechanic on this clock") },
    ]);
    expect(await db.selectFrom("bench_clock_ends").select("id").where("clock_id", "=", clockId).execute()).toEqual([]);
    await send(mech, [op(mech, job.id, "clock.off", { clockId, endedAt: at(150) }, 150)]);
  });

  it("holds a clock-off that arrives before its clock-on, and applies it when the clock-on comes", async () => {
    const job = await newJob();
    const clockId = randomUUID();
    const on = op(sup, job.id, "clock.on", { clockId, startedAt: at(200) }, 200);
    const off = op(sup, job.id, "clock.off", { clockId, endedAt: at(245) }, 245);
    const first = await send(sup, [off]);
    expect(first).toMatchObject({
      accepted: [],
      refused: [],
      pending: [{ id: off.id, reason: expect.stringContaining(`the clock-on of clock ${clockId}`) }],
    });
    const second = await send(sup, [on]);
    expect(second.accepted).toEqual([on.id]);
    const held = await db.selectFrom("sync_pending_operations").select("resolution").where("id", "=", off.id).executeTakeFirstOrThrow();
    expect(held.resolution).toBe("applied");
    expect((await send(sup, [off])).duplicates).toEqual([off.id]);
    expect((await hoursOfJob(db, fx.shopId, job.id))!.totalMinutes).toBe(45);
  });

  it("refuses a clock-on naming a stage that is not on the job", async () => {
    const job = await newJob();
    const bad = op(
      mech,
      job.id,
      "clock.on",
      { clockId: randomUUID(), startedAt: at(300), jobProcedureId: job.jobProcedureId, stageKey: "no-such-stage" },
      300,
    );
    expect((await send(mech, [bad])).refused).toEqual([{ id: bad.id, reason: expect.stringContaining('Stage "no-such-stage"') }]);
  });
});

describe("a supervisor closes a forgotten clock", () => {
  it("writes a closing record with who, when and why; refuses a second close, an end before the clock-on, and a mechanic", async () => {
    const job = await newJob();
    const clockId = randomUUID();
    await send(mech, [op(mech, job.id, "clock.on", { clockId, startedAt: at(400) }, 400)]);
    const call = (user: SessionUser, body: unknown) =>
      closeRoute.handle(
        appRequest(`/api/jobs/${job.id}/clocks/${clockId}/close`, {
          method: "POST",
          body: JSON.stringify(body),
          headers: { "content-type": "application/json" },
        }),
        {
          user,
          db,
          params: { id: job.id, clockId },
        },
      );
    expect((await call(mech, { endedAt: at(480), reason: "Went home" })).status).toBe(403);
    const before = await call(sup, { endedAt: at(390), reason: "Forgot to clock off" });
    expect(before.status).toBe(409);
    expect((await before.json()).error).toMatch(/before the clock-on/);
    const short = await call(sup, { endedAt: at(480), reason: "x" });
    expect(short.status).toBe(400);
    expect(JSON.stringify(await short.json())).toMatch(/Reason/);
    const ok = await call(sup, { endedAt: at(480), reason: "Left at 4 pm, tablet stayed on" });
    expect(ok.status).toBe(201);
    const end = await db.selectFrom("bench_clock_ends").selectAll().where("clock_id", "=", clockId).executeTakeFirstOrThrow();
    expect(end).toMatchObject({
      kind: "closed-by-supervisor",
      recorded_by: sup.id,
      reason: "Left at 4 pm, tablet stayed on",
      operation_id: null,
    });
    expect(end.ended_at.toISOString()).toBe(at(480));
    const audit = await db.selectFrom("audit_log").select(["action", "actor_id"]).where("entity_id", "=", clockId).execute();
    expect(audit).toEqual([{ action: "clock.closed", actor_id: sup.id }]);
    const again = await call(sup, { endedAt: at(490), reason: "Closing it twice" });
    expect(again.status).toBe(409);
    expect((await again.json()).error).toMatch(/already ended/);
    // append-only: the closing record cannot be changed or removed
    await expect(sql`UPDATE bench_clock_ends SET reason = 'changed' WHERE clock_id = ${clockId}`.execute(db)).rejects.toThrow();
    await expect(sql`DELETE FROM bench_clocks WHERE id = ${clockId}`.execute(db)).rejects.toThrow();
    // a clock-off that arrives later still counts when it is earlier: the earliest end stands
    await send(mech, [op(mech, job.id, "clock.off", { clockId, endedAt: at(470) }, 470)]);
    expect((await hoursOfJob(db, fx.shopId, job.id))!.totalMinutes).toBe(70);
  });

  it("refuses to close a clock in the future", async () => {
    const job = await newJob();
    const clockId = randomUUID();
    await send(mech2, [op(mech2, job.id, "clock.on", { clockId, startedAt: at(500) }, 500)]);
    await expect(
      closeForgottenClock(db, sup, clockId, { endedAt: new Date(Date.now() + 3_600_000).toISOString(), reason: "Too far ahead" }),
    ).rejects.toThrow(/in the future/);
    await send(mech2, [op(mech2, job.id, "clock.off", { clockId, endedAt: at(510) }, 510)]);
  });
});

describe("hours per stage and per person against the quoted labour", () => {
  it("sums each person's clocks per stage and compares with the approved quote's labour lines", async () => {
    const job = await newJob();
    const quote = await db
      .insertInto("quotes")
      .values({
        shop_id: fx.shopId,
        work_order_id: job.id,
        version: 1,
        status: "approved",
        currency: "GBP",
        tax_rate_bp: 2000,
        created_by: fx.users.office.id,
        sent_at: new Date(),
        approved_at: new Date(),
        approved_by: null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await db
      .insertInto("quote_lines")
      .values([
        {
          quote_id: quote.id,
          position: 0,
          kind: "labour",
          description: "Strip and measure",
          part_number: null,
          quantity_hundredths: 150,
          unit_price_minor: 6800,
          line_total_minor: 10200,
        },
        {
          quote_id: quote.id,
          position: 1,
          kind: "part",
          description: "Gaskets",
          part_number: "GS-1",
          quantity_hundredths: 100,
          unit_price_minor: 2000,
          line_total_minor: 2000,
        },
      ])
      .execute();
    const c1 = randomUUID();
    const c2 = randomUUID();
    const c3 = randomUUID();
    // this mechanic's clocks start late in the day, after any clock of theirs on the other tests' jobs
    await send(mech, [
      op(mech, job.id, "clock.on", { clockId: c1, startedAt: at(700), jobProcedureId: job.jobProcedureId, stageKey: "measure" }, 700),
      op(mech, job.id, "clock.off", { clockId: c1, endedAt: at(760) }, 760),
      op(mech, job.id, "clock.on", { clockId: c3, startedAt: at(770) }, 770),
      op(mech, job.id, "clock.off", { clockId: c3, endedAt: at(790) }, 790),
    ]);
    await send(mech2, [
      op(mech2, job.id, "clock.on", { clockId: c2, startedAt: at(700), jobProcedureId: job.jobProcedureId, stageKey: "measure" }, 700),
      op(mech2, job.id, "clock.off", { clockId: c2, endedAt: at(745) }, 745),
    ]);
    const res = await hoursRoute.handle(appRequest(`/api/jobs/${job.id}/hours`), {
      user: { ...fx.users.office, customerId: null },
      db,
      params: { id: job.id },
    });
    expect(res.status).toBe(200);
    const h = await res.json();
    expect(h.totalMinutes).toBe(125);
    expect(h.byPerson).toEqual(
      expect.arrayContaining([
        { key: mech.id, minutes: 80, running: false },
        { key: mech2.id, minutes: 45, running: false },
      ]),
    );
    expect(h.byStage).toEqual(
      expect.arrayContaining([
        { key: `${job.jobProcedureId}|measure`, minutes: 105, running: false },
        { key: "", minutes: 20, running: false },
      ]),
    );
    expect(h.quotedHundredths).toBe(150);
    // 125 min = 2.083 h → 208 hundredths; 58 over the 1.50 h quoted
    expect(h.overQuoteHundredths).toBe(58);
    expect(h.stageTitles[`${job.jobProcedureId}|measure`]).toBeTruthy();
    // a mechanic may not read it
    expect((await hoursRoute.handle(appRequest(`/api/jobs/${job.id}/hours`), { user: mech, db, params: { id: job.id } })).status).toBe(403);
  });
});
