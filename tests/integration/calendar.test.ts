import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { POST as cancelRoute } from "@/app/api/office/bookings/[id]/cancel/route";
import { POST as bookRoute } from "@/app/api/office/bookings/route";
import { POST as deliveriesRoute } from "@/app/api/office/stock/deliveries/route";
import { POST as reservationsRoute } from "@/app/api/office/stock/reservations/route";
import { GET as dynoBookingsRoute } from "@/app/api/jobs/[id]/dyno-bookings/route";
import { PUT as hoursRoute } from "@/app/api/office/opening-hours/route";
import { POST as retireRoute } from "@/app/api/office/resources/[id]/retire/route";
import { POST as addResourceRoute } from "@/app/api/office/resources/route";
import { POST as promiseRoute } from "@/app/api/office/work-orders/[id]/promise/route";
import { listLateJobs } from "@/db/calendar/promises";
import { listWeek } from "@/db/calendar/bookings";
import { moveWorkOrder } from "@/db/shop/work-orders";
import { addDays, dayIn } from "@/lib/aftercare/reminders";
import type { SessionUser } from "@/lib/auth/session-user";
import { shortDay, weekStart } from "@/lib/calendar/rules";
import { appRequest } from "./support/route-calls";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// The shop's calendar on real PostgreSQL: the exclusion constraint refuses double bookings (also
// two at once), every refusal saves nothing, cancelling frees the slot, late jobs are listed.

const db = useTestDb();

const post = (url: string, body: unknown) =>
  appRequest(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
const book = (user: SessionUser, body: unknown) => bookRoute.handle(post("/api/office/bookings", body), { user, db, params: {} });
const cancel = (user: SessionUser, id: string, reason: string) =>
  cancelRoute.handle(post(`/api/office/bookings/${id}/cancel`, { reason }), { user, db, params: { id } });

/** A fixture shop with a dyno and a bay, a second open job, and a Monday two weeks ahead. */
async function shopWithDyno() {
  const fx = await createShopFixture(db);
  const office = fx.users.office as SessionUser;
  const add = async (kind: string, name: string) => {
    const res = await addResourceRoute.handle(post("/api/office/resources", { kind, name }), { user: office, db, params: {} });
    expect(res.status).toBe(201);
    return ((await res.json()) as { id: string }).id;
  };
  const dyno = await add("dyno", "Dyno");
  const bay = await add("bay", "Bay 2");
  const second = await db
    .insertInto("work_orders")
    .values({
      shop_id: fx.shopId,
      bike_id: fx.bike.id,
      number: 2,
      title: "Second job",
      status: "approved",
      intake_odometer_km: 10,
      closed_at: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  const monday = weekStart(addDays(dayIn("UTC"), 14));
  return { fx, office, dyno, bay, second: second.id, monday };
}

const liveBookings = (resourceId: string) =>
  db
    .selectFrom("bookings")
    .select(["id", "work_order_id as workOrderId"])
    .where("resource_id", "=", resourceId)
    .where("released_at", "is", null)
    .execute();

async function refusal(res: Response) {
  return (await res.json()) as { error: string; issues: { path: string; message: string }[] };
}

describe("double bookings", () => {
  it("an overlap is refused by PostgreSQL, naming the booking already there; back-to-back is fine", async () => {
    const s = await shopWithDyno();
    const first = await book(s.office, { resourceId: s.dyno, workOrderId: s.fx.workOrderId, day: s.monday, from: "09:00", to: "11:00" });
    expect(first.status).toBe(201);
    const clash = await book(s.office, { resourceId: s.dyno, workOrderId: s.second, day: s.monday, from: "10:30", to: "12:00" });
    expect(clash.status).toBe(409);
    expect((await refusal(clash)).error).toBe(`The dyno is booked for job #1, 09:00–11:00 on ${shortDay(s.monday)}.`);
    const after = await book(s.office, { resourceId: s.dyno, workOrderId: s.second, day: s.monday, from: "11:00", to: "12:00" });
    expect(after.status).toBe(201);
    // Another resource at the same time is its own calendar.
    expect((await book(s.office, { resourceId: s.bay, workOrderId: s.second, day: s.monday, from: "09:00", to: "11:00" })).status).toBe(
      201,
    );
    expect((await liveBookings(s.dyno)).length).toBe(2);
    // Even a direct insert is refused by the constraint.
    await expect(
      db
        .insertInto("bookings")
        .values({
          shop_id: s.fx.shopId,
          resource_id: s.dyno,
          work_order_id: s.second,
          during: `[${s.monday} 09:30+00,${s.monday} 09:45+00)`,
          booked_by: s.office.id,
        })
        .execute(),
    ).rejects.toThrow(/bookings_no_double/);
  });

  it("two requests at once for overlapping times: exactly one is stored, the other names it", async () => {
    const s = await shopWithDyno();
    const [a, b] = await Promise.all([
      book(s.office, { resourceId: s.dyno, workOrderId: s.fx.workOrderId, day: s.monday, from: "13:00", to: "15:00" }),
      book(s.office, { resourceId: s.dyno, workOrderId: s.second, day: s.monday, from: "14:00", to: "16:00" }),
    ]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    const live = await liveBookings(s.dyno);
    expect(live.length).toBe(1);
    const loser = a.status === 409 ? a : b;
    const winnerNumber = live[0].workOrderId === s.fx.workOrderId ? 1 : 2;
    const winnerTimes = winnerNumber === 1 ? "13:00–15:00" : "14:00–16:00";
    expect((await refusal(loser)).error).toBe(`The dyno is booked for job #${winnerNumber}, ${winnerTimes} on ${shortDay(s.monday)}.`);
  });
});

describe("a resource retired while it is being booked", () => {
  it("the booking that waited for the retirement sees it and is refused; nothing is stored on the retired resource", async () => {
    const s = await shopWithDyno();
    let booking: Promise<Response> | null = null;
    // the retirement as retireResource writes it, held open while a booking for the same bay comes in
    await db.transaction().execute(async (trx) => {
      await trx.selectFrom("shop_resources").select("id").where("id", "=", s.bay).forUpdate().execute();
      await trx
        .insertInto("resource_retirements")
        .values({ shop_id: s.fx.shopId, resource_id: s.bay, reason: "Bay floor being relaid", retired_by: s.office.id })
        .execute();
      booking = book(s.office, { resourceId: s.bay, workOrderId: s.fx.workOrderId, day: s.monday, from: "09:00", to: "10:00" });
      // the booking is now waiting for the bay's row
      for (let i = 0; i < 50; i++) {
        const waiting = await sql<{ n: number }>`
          SELECT count(*)::int AS n FROM pg_stat_activity WHERE wait_event_type = 'Lock' AND datname = current_database()`.execute(db);
        if (waiting.rows[0].n > 0) break;
        await new Promise((r) => setTimeout(r, 20));
      }
    });
    const res = await booking!;
    expect(res.status).toBe(409);
    expect((await refusal(res)).error).toBe("Bay 2 is retired and can no longer be booked.");
    expect(await liveBookings(s.bay)).toEqual([]);
  });
});

describe("retiring a resource with jobs still booked on it", () => {
  it("is refused, naming each booking still to come; once they are cancelled it is retired", async () => {
    const s = await shopWithDyno();
    const first = await book(s.office, { resourceId: s.dyno, workOrderId: s.fx.workOrderId, day: s.monday, from: "09:00", to: "11:00" });
    const tuesday = addDays(s.monday, 1);
    const second = await book(s.office, { resourceId: s.dyno, workOrderId: s.second, day: tuesday, from: "13:00", to: "15:30" });
    expect([first.status, second.status]).toEqual([201, 201]);
    const retire = () =>
      retireRoute.handle(post(`/api/office/resources/${s.dyno}/retire`, { reason: "Rollers sent away for regrinding" }), {
        user: s.office,
        db,
        params: { id: s.dyno },
      });
    const refused = await retire();
    expect(refused.status).toBe(409);
    expect((await refusal(refused)).error).toBe(
      `Dyno still has 2 bookings to come (job #1, 09:00–11:00 on ${shortDay(s.monday)}; job #2, 13:00–15:30 on ${shortDay(tuesday)}): book those jobs elsewhere or cancel, then retire it.`,
    );
    expect(await db.selectFrom("resource_retirements").select("id").where("resource_id", "=", s.dyno).execute()).toEqual([]);
    for (const res of [first, second]) {
      const { id } = (await res.json()) as { id: string };
      expect((await cancel(s.office, id, "Dyno going away for a month")).status).toBe(201);
    }
    expect((await retire()).status).toBe(201);
  });
});

describe("a job that closes", () => {
  it("lets go its stock still put aside and cancels its bookings still to come, with the move as the reason", async () => {
    const s = await shopWithDyno();
    const delivery = await deliveriesRoute.handle(
      post("/api/office/stock/deliveries", {
        supplier: "Harbour Pistons",
        lines: [{ partNumber: "GS-RB-8", description: "Rod bolt", location: "Shelf B2", batch: "L24-200", quantity: 8 }],
      }),
      { user: s.office, db, params: {} },
    );
    const lotId = ((await delivery.json()) as { lots: string[] }).lots[0];
    const reserved = await reservationsRoute.handle(post("/api/office/stock/reservations", { lotId, workOrderNumber: 2, quantity: 5 }), {
      user: s.office,
      db,
      params: {},
    });
    expect(reserved.status).toBe(201);
    const booked = await book(s.office, { resourceId: s.dyno, workOrderId: s.second, day: s.monday, from: "09:00", to: "11:00" });
    expect(booked.status).toBe(201);
    expect((await db.selectFrom("stock_lots").select("reserved").where("id", "=", lotId).executeTakeFirstOrThrow()).reserved).toBe(5);

    await moveWorkOrder(db, s.fx.shopId, s.office.id, s.second, "cancelled", { note: "Customer sold the bike" });

    expect(await db.selectFrom("stock_lots").select(["on_hand", "reserved"]).where("id", "=", lotId).executeTakeFirstOrThrow()).toEqual({
      on_hand: 8,
      reserved: 0,
    });
    const released = await db
      .selectFrom("stock_movements")
      .select(["quantity", "reason"])
      .where("lot_id", "=", lotId)
      .where("kind", "=", "released")
      .execute();
    expect(released).toEqual([{ quantity: 5, reason: "Job #2 cancelled: let go when it closed." }]);
    expect(await liveBookings(s.dyno)).toEqual([]);
    const why = await db.selectFrom("booking_cancellations").select("reason").where("shop_id", "=", s.fx.shopId).execute();
    expect(why).toEqual([{ reason: "Job #2 cancelled: let go when it closed." }]);
    // the slot is free for another job
    expect(
      (await book(s.office, { resourceId: s.dyno, workOrderId: s.fx.workOrderId, day: s.monday, from: "09:00", to: "11:00" })).status,
    ).toBe(201);
  });
});

describe("the hour the clocks go forward", () => {
  it("a booking wholly inside it is refused in words, not a server error; the hour after is booked", async () => {
    const s = await shopWithDyno();
    // a shop open round the clock on Sundays, in a zone that moves its clocks: 28 March 2027, 01:00 → 02:00
    await db
      .updateTable("shops")
      .set({ time_zone: "Europe/London", opens_at: "00:00", closes_at: "23:59", open_days: [1, 2, 3, 4, 5, 6, 7] })
      .where("id", "=", s.fx.shopId)
      .execute();
    const gap = await book(s.office, { resourceId: s.dyno, workOrderId: s.fx.workOrderId, day: "2027-03-28", from: "01:00", to: "02:00" });
    expect(gap.status).toBe(422);
    expect((await refusal(gap)).error).toBe(
      "01:00–02:00 on 28 Mar 2027 does not happen: the clocks go forward then (Europe/London). Book a later time.",
    );
    expect(await liveBookings(s.dyno)).toEqual([]);
    // one that starts inside it and ends as it does (01:30 does not exist; PostgreSQL reads it as 01:30 GMT)
    const startsInGap = await book(s.office, {
      resourceId: s.dyno,
      workOrderId: s.fx.workOrderId,
      day: "2027-03-28",
      from: "01:30",
      to: "02:00",
    });
    expect(startsInGap.status).toBe(422);
    expect((await refusal(startsInGap)).error).toBe(
      "01:30–02:00 on 28 Mar 2027 does not happen: the clocks go forward then (Europe/London). Book a later time.",
    );
    expect(await liveBookings(s.dyno)).toEqual([]);
    const after = await book(s.office, {
      resourceId: s.dyno,
      workOrderId: s.fx.workOrderId,
      day: "2027-03-28",
      from: "02:00",
      to: "03:00",
    });
    expect(after.status).toBe(201);
  });
});

describe("refusals save nothing", () => {
  it("until before from, a closed day, outside opening hours, a retired resource, a closed job", async () => {
    const s = await shopWithDyno();
    const base = { resourceId: s.dyno, workOrderId: s.fx.workOrderId, day: s.monday };
    const cases: [unknown, number, RegExp][] = [
      [{ ...base, from: "11:00", to: "09:00" }, 422, /Until \(09:00\) must be after from \(11:00\)/],
      [{ ...base, from: "10:00", to: "10:00" }, 422, /must be after from/],
      [{ ...base, day: addDays(s.monday, 5), from: "10:00", to: "11:00" }, 422, /closed on Saturdays/],
      [{ ...base, from: "07:00", to: "09:00" }, 422, /outside opening hours \(08:00–18:00\)/],
      [{ ...base, from: "17:00", to: "18:30" }, 422, /outside opening hours/],
      [{ ...base, from: "25:00", to: "26:00" }, 400, /From must be a time of day/],
      [{ ...base, day: "0000-01-01", from: "09:00", to: "10:00" }, 400, /Day must be a/],
      [{ ...base, from: "09:00", to: "10:00", note: "a\u0000b" }, 400, /Note/],
      [
        { ...base, day: addDays(s.monday, -21), from: "09:00", to: "10:00" },
        422,
        /is already over \(it is \d\d:\d\d on .*\): book a time still to come/,
      ],
    ];
    for (const [body, status, message] of cases) {
      const res = await book(s.office, body);
      expect(res.status, JSON.stringify(body)).toBe(status);
      const r = await refusal(res);
      expect([r.error, ...r.issues.map((i) => i.message)].join(" | ")).toMatch(message);
    }
    // Retired resource.
    const retired = await retireRoute.handle(
      post(`/api/office/resources/${s.bay}/retire`, { reason: "Lift ram leaking, bay out of use" }),
      {
        user: s.office,
        db,
        params: { id: s.bay },
      },
    );
    expect(retired.status).toBe(201);
    const onRetired = await book(s.office, { ...base, resourceId: s.bay, from: "09:00", to: "10:00" });
    expect(onRetired.status).toBe(409);
    expect((await refusal(onRetired)).error).toBe("Bay 2 is retired and can no longer be booked.");
    // Closed job.
    await db.updateTable("work_orders").set({ status: "cancelled", closed_at: new Date() }).where("id", "=", s.second).execute();
    const closed = await book(s.office, { ...base, workOrderId: s.second, from: "09:00", to: "10:00" });
    expect(closed.status).toBe(409);
    expect((await refusal(closed)).error).toMatch(/Job #2 is cancelled: a closed job cannot be booked/);
    expect((await liveBookings(s.dyno)).length + (await liveBookings(s.bay)).length).toBe(0);
    // Only office people book.
    expect((await book(s.fx.users.mechanic as SessionUser, { ...base, from: "09:00", to: "10:00" })).status).toBe(403);
  });
});

describe("cancelling", () => {
  it("is its own record with the reason; the slot can be booked again; a booking cannot be edited or deleted", async () => {
    const s = await shopWithDyno();
    const res = await book(s.office, { resourceId: s.dyno, workOrderId: s.fx.workOrderId, day: s.monday, from: "09:00", to: "11:00" });
    const { id } = (await res.json()) as { id: string };
    expect((await cancel(s.office, id, "x")).status).toBe(400);
    const c = await cancel(s.office, id, "Customer moved the tuning day");
    expect(c.status).toBe(201);
    const again = await cancel(s.office, id, "Second try");
    expect(again.status).toBe(409);
    expect((await refusal(again)).error).toMatch(/already cancelled by office/);
    const rebook = await book(s.office, { resourceId: s.dyno, workOrderId: s.second, day: s.monday, from: "10:00", to: "12:00" });
    expect(rebook.status).toBe(201);
    const rows = await db
      .selectFrom("bookings")
      .select(["id", "released_at"])
      .where("resource_id", "=", s.dyno)
      .orderBy("booked_at")
      .execute();
    expect(rows.length).toBe(2);
    expect(rows[0].released_at).not.toBeNull();
    const rec = await db
      .selectFrom("booking_cancellations")
      .select(["reason", "cancelled_by"])
      .where("booking_id", "=", id)
      .executeTakeFirstOrThrow();
    expect(rec).toEqual({ reason: "Customer moved the tuning day", cancelled_by: s.office.id });
    await expect(db.deleteFrom("bookings").where("id", "=", id).execute()).rejects.toThrow(/append-only/);
    await expect(db.updateTable("bookings").set({ note: "changed" }).where("id", "=", rows[1].id).execute()).rejects.toThrow(/append-only/);
    await expect(db.updateTable("bookings").set({ released_at: new Date() }).where("id", "=", rows[1].id).execute()).rejects.toThrow(
      /append-only/,
    );
    // The week view and the dyno page's reading show only the live booking.
    const week = await listWeek(db, s.fx.shopId, s.dyno, s.monday);
    expect(week.map((b) => [b.number, b.day, b.from, b.to])).toEqual([[2, s.monday, "10:00", "12:00"]]);
    const mech = s.fx.users.mechanic as SessionUser;
    const dyno = await dynoBookingsRoute.handle(appRequest(`/api/jobs/${s.second}/dyno-bookings`), {
      user: mech,
      db,
      params: { id: s.second },
    });
    expect(dyno.status).toBe(200);
    const body = (await dyno.json()) as { bookings: { from: string; resourceName: string }[] };
    expect(body.bookings.map((b) => [b.resourceName, b.from])).toEqual([["Dyno", "10:00"]]);
  });
});

describe("promised dates and late jobs", () => {
  it("the office sets a promised date (not in the past); jobs past it and not ready are listed as late", async () => {
    const s = await shopWithDyno();
    const today = dayIn("UTC");
    const promise = (id: string, promisedOn: string) =>
      promiseRoute.handle(post(`/api/office/work-orders/${id}/promise`, { promisedOn }), { user: s.office, db, params: { id } });
    const past = await promise(s.fx.workOrderId, addDays(today, -1));
    expect(past.status).toBe(422);
    expect((await refusal(past)).error).toMatch(/is in the past/);
    expect((await promise(s.fx.workOrderId, addDays(today, 3))).status).toBe(201);
    expect(await listLateJobs(db, s.fx.shopId)).toEqual([]);
    // Time passes: a promise made earlier for a day now gone (written as the record a past request left).
    await db
      .insertInto("work_order_promises")
      .values({
        shop_id: s.fx.shopId,
        work_order_id: s.second,
        promised_on: addDays(today, -2),
        set_by: s.office.id,
        set_at: new Date(Date.now() - 5 * 86_400_000),
      })
      .execute();
    const late = await listLateJobs(db, s.fx.shopId);
    expect(late.map((j) => [j.number, j.promisedOn, j.daysLate, j.setBy])).toEqual([[2, addDays(today, -2), 2, s.fx.users.office.name]]);
    // A newer promise counts: the job is no longer late; a ready job is never late.
    expect((await promise(s.second, today)).status).toBe(201);
    expect(await listLateJobs(db, s.fx.shopId)).toEqual([]);
    await db
      .insertInto("work_order_promises")
      .values({ shop_id: s.fx.shopId, work_order_id: s.fx.workOrderId, promised_on: addDays(today, -1), set_by: s.office.id })
      .execute();
    expect((await listLateJobs(db, s.fx.shopId)).map((j) => j.number)).toEqual([1]);
    await db.updateTable("work_orders").set({ status: "ready" }).where("id", "=", s.fx.workOrderId).execute();
    expect(await listLateJobs(db, s.fx.shopId)).toEqual([]);
  });
});

describe("opening hours", () => {
  const put = (user: SessionUser, body: unknown) =>
    hoursRoute.handle(
      appRequest("/api/office/opening-hours", {
        method: "PUT",
        headers: { "content-type": "application/json" },
        body: JSON.stringify(body),
      }),
      { user, db, params: {} },
    );

  it("the office sets them (audited, before and after); bookings from then on must fit; bad hours are refused and change nothing", async () => {
    const s = await shopWithDyno();
    const cases: [unknown, RegExp][] = [
      [{ opensAt: "18:00", closesAt: "08:00", openDays: [1] }, /Closes at must be after opens at/],
      [{ opensAt: "08:00", closesAt: "18:00", openDays: [] }, /at least one day/],
      [{ opensAt: "08:00", closesAt: "18:00", openDays: [1, 1] }, /Each open day once/],
      [{ opensAt: "8 o'clock", closesAt: "18:00", openDays: [1] }, /Opens at must be a time of day/],
      [{ opensAt: "08:00", closesAt: "18:00", openDays: [9] }, /Open days|weekdays|7/],
    ];
    for (const [body, message] of cases) {
      const res = await put(s.office, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      const r = await refusal(res);
      expect([r.error, ...r.issues.map((i) => i.message)].join(" | ")).toMatch(message);
    }
    const unchanged = await db
      .selectFrom("shops")
      .select(["opens_at", "closes_at", "open_days"])
      .where("id", "=", s.fx.shopId)
      .executeTakeFirstOrThrow();
    expect([unchanged.opens_at, unchanged.closes_at, unchanged.open_days.map(Number)]).toEqual(["08:00:00", "18:00:00", [1, 2, 3, 4, 5]]);
    expect((await put(s.fx.users.mechanic as SessionUser, { opensAt: "07:00", closesAt: "19:00", openDays: [1] })).status).toBe(403);

    const res = await put(s.office, { opensAt: "07:30", closesAt: "16:00", openDays: [6, 1, 2, 3, 4] });
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ opensAt: "07:30", closesAt: "16:00", openDays: [1, 2, 3, 4, 6] });
    const base = { resourceId: s.dyno, workOrderId: s.fx.workOrderId };
    expect((await book(s.office, { ...base, day: s.monday, from: "07:30", to: "08:30" })).status).toBe(201);
    expect((await refusal(await book(s.office, { ...base, day: s.monday, from: "15:00", to: "17:00" }))).error).toBe(
      "15:00–17:00 is outside opening hours (07:30–16:00).",
    );
    expect((await book(s.office, { ...base, day: addDays(s.monday, 5), from: "09:00", to: "10:00" })).status).toBe(201);
    expect((await refusal(await book(s.office, { ...base, day: addDays(s.monday, 4), from: "09:00", to: "10:00" }))).error).toMatch(
      /closed on Fridays/,
    );
    const audit = await db
      .selectFrom("audit_log")
      .select(["actor_id", "detail"])
      .where("shop_id", "=", s.fx.shopId)
      .where("action", "=", "shop.opening-hours")
      .execute();
    expect(audit).toEqual([
      {
        actor_id: s.office.id,
        detail: {
          before: { opensAt: "08:00", closesAt: "18:00", openDays: [1, 2, 3, 4, 5] },
          after: { opensAt: "07:30", closesAt: "16:00", openDays: [1, 2, 3, 4, 6] },
        },
      },
    ]);
  });
});
