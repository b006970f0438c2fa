import "server-only";
import { sql, type Kysely, type RawBuilder, type Transaction } from "kysely";
import { DatabaseError } from "pg";
import type { SessionUser } from "@/lib/auth/session-user";
import { addDays, dayLabel } from "@/lib/aftercare/reminders";
import { wallClockIn } from "@/lib/format/dates";
import { bookingTimeProblem, clashMessage, type NewBookingInput, type ResourceKind } from "@/lib/calendar/rules";
import { Refusal } from "@/lib/errors";
import { STATUS_LABELS } from "@/lib/work-orders/status";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";

// Bookings of a work order on a resource. PostgreSQL refuses an overlap itself (the exclusion
// constraint bookings_no_double); the refusal names the booking already there. Cancelling is its
// own record, which frees the slot.

const EXCLUSION_VIOLATION = "23P01";
const CLOSED = ["handed_over", "cancelled"] as const;

/** The instant range of a day's wall-clock times in the shop's zone, as PostgreSQL computes it. */
function rangeOf(day: string, from: string, to: string, timeZone: string): RawBuilder<string> {
  return sql<string>`tstzrange((${day}::date + ${from}::time) AT TIME ZONE ${timeZone}, (${day}::date + ${to}::time) AT TIME ZONE ${timeZone}, '[)')`;
}

/** Local day, from and until of a booking (shop zone), for reading. */
const localParts = (timeZone: string) =>
  [
    sql<string>`to_char(lower(b.during) AT TIME ZONE ${timeZone}, 'YYYY-MM-DD')`.as("day"),
    sql<string>`to_char(lower(b.during) AT TIME ZONE ${timeZone}, 'HH24:MI')`.as("from"),
    sql<string>`to_char(upper(b.during) AT TIME ZONE ${timeZone}, 'HH24:MI')`.as("to"),
  ] as const;

/** A resource's bookings not cancelled and not yet over, soonest first, as the shop's clock reads them. */
export async function bookingsStillToCome(db: Kysely<Database>, shopId: string, resourceId: string) {
  const { timeZone } = await shopOf(db, shopId);
  return db
    .selectFrom("bookings as b")
    .innerJoin("work_orders as w", "w.id", "b.work_order_id")
    .select(["b.id", "w.number", ...localParts(timeZone)])
    .where("b.shop_id", "=", shopId)
    .where("b.resource_id", "=", resourceId)
    .where("b.released_at", "is", null)
    .where(sql<boolean>`upper(b.during) > now()`)
    .orderBy(sql`lower(b.during)`)
    .execute();
}

async function shopOf(db: Kysely<Database>, shopId: string) {
  const s = await db
    .selectFrom("shops")
    .select(["time_zone as timeZone", "opens_at as opensAt", "closes_at as closesAt", "open_days as openDays"])
    .where("id", "=", shopId)
    .executeTakeFirstOrThrow();
  return { ...s, openDays: s.openDays.map(Number) };
}

/** Books a work order on a resource; refused with the reason (and nothing saved) when it cannot be. */
export async function bookWorkOrder(db: Kysely<Database>, user: SessionUser, input: NewBookingInput) {
  const shop = await shopOf(db, user.shopId);
  const problem = bookingTimeProblem(input, shop, wallClockIn(shop.timeZone));
  if (problem) throw new Refusal(problem.message, 422, [problem]);
  const during = () => rangeOf(input.day, input.from, input.to, shop.timeZone);
  // the hour the clocks go forward does not happen: a booking wholly inside it is no time at all, and
  // one that starts inside it can end before it starts (PostgreSQL reads a time that does not exist
  // with the offset before the change); both are said in words, never left to fail the range
  const bounds = await sql<{ lo: Date; hi: Date }>`
    SELECT (${input.day}::date + ${input.from}::time) AT TIME ZONE ${shop.timeZone} AS lo,
           (${input.day}::date + ${input.to}::time) AT TIME ZONE ${shop.timeZone} AS hi`.execute(db);
  if (bounds.rows[0].lo.getTime() >= bounds.rows[0].hi.getTime()) {
    const message = `${input.from}–${input.to} on ${dayLabel(input.day)} does not happen: the clocks go forward then (${shop.timeZone}). Book a later time.`;
    throw new Refusal(message, 422, [{ path: "from", message }]);
  }
  try {
    return await db.transaction().execute(async (trx) => {
      const resource = await trx
        .selectFrom("shop_resources as r")
        .select(["r.id", "r.kind", "r.name"])
        .where("r.id", "=", input.resourceId)
        .where("r.shop_id", "=", user.shopId)
        .forShare("r")
        .executeTakeFirst();
      if (!resource) throw new Refusal("No such resource in this shop.", 404, [{ path: "resourceId", message: "not found" }]);
      // read after the lock, in a statement of its own: a retirement that held the resource while this
      // waited is seen (joined into the locking statement, it was read as it stood before the wait)
      const retired = await trx.selectFrom("resource_retirements").select("id").where("resource_id", "=", resource.id).executeTakeFirst();
      if (retired)
        throw new Refusal(`${resource.name} is retired and can no longer be booked.`, 409, [{ path: "resourceId", message: "retired" }]);
      const wo = await trx
        .selectFrom("work_orders")
        .select(["id", "number", "status"])
        .where("id", "=", input.workOrderId)
        .where("shop_id", "=", user.shopId)
        .forShare()
        .executeTakeFirst();
      if (!wo) throw new Refusal("No such job in this shop.", 404, [{ path: "workOrderId", message: "not found" }]);
      if ((CLOSED as readonly string[]).includes(wo.status))
        throw new Refusal(`Job #${wo.number} is ${STATUS_LABELS[wo.status].toLowerCase()}: a closed job cannot be booked.`, 409, [
          { path: "workOrderId", message: "closed job" },
        ]);
      const row = await trx
        .insertInto("bookings")
        .values({
          shop_id: user.shopId,
          resource_id: resource.id,
          work_order_id: wo.id,
          during: during(),
          note: input.note ?? "",
          booked_by: user.id,
        })
        .returning(["id", "booked_at as bookedAt"])
        .executeTakeFirstOrThrow();
      await appendAudit(trx, [
        {
          shopId: user.shopId,
          actorId: user.id,
          action: "booking.add",
          entity: "booking",
          entityId: row.id,
          workOrderId: wo.id,
          outcome: "accepted",
          detail: { resource: resource.name, day: input.day, from: input.from, to: input.to },
        },
      ]);
      return row;
    });
  } catch (err) {
    if (!(err instanceof DatabaseError) || err.code !== EXCLUSION_VIOLATION) throw err;
    const other = await db
      .selectFrom("bookings as b")
      .innerJoin("shop_resources as r", "r.id", "b.resource_id")
      .innerJoin("work_orders as w", "w.id", "b.work_order_id")
      .select(["b.id", "r.kind", "r.name", "w.number", ...localParts(shop.timeZone)])
      .where("b.resource_id", "=", input.resourceId)
      .where("b.released_at", "is", null)
      .where(sql<boolean>`b.during && ${during()}`)
      .orderBy(sql`lower(b.during)`)
      .executeTakeFirst();
    // The clash was cancelled between the refusal and this read: say so rather than guess.
    if (!other) throw new Refusal("That time was taken a moment ago and has just been freed: try again.", 409);
    const message = clashMessage({ kind: other.kind, name: other.name }, other);
    throw new Refusal(message, 409, [{ path: "from", message }]);
  }
}

/** Cancels a booking with the reason (its own record, once); the slot is free again. */
export async function cancelBooking(db: Kysely<Database>, user: SessionUser, bookingId: string, reason: string) {
  return db.transaction().execute(async (trx) => {
    const b = await trx
      .selectFrom("bookings")
      .select(["id", "work_order_id as workOrderId"])
      .where("id", "=", bookingId)
      .where("shop_id", "=", user.shopId)
      .forUpdate()
      .executeTakeFirst();
    if (!b) throw new Refusal("No such booking in this shop.", 404);
    const done = await trx
      .selectFrom("booking_cancellations as c")
      .innerJoin("users as u", "u.id", "c.cancelled_by")
      .select(["u.name"])
      .where("c.booking_id", "=", bookingId)
      .executeTakeFirst();
    if (done) throw new Refusal(`This booking was already cancelled by ${done.name}.`, 409);
    const row = await trx
      .insertInto("booking_cancellations")
      .values({ shop_id: user.shopId, booking_id: bookingId, reason, cancelled_by: user.id })
      .returning(["id", "cancelled_at as cancelledAt"])
      .executeTakeFirstOrThrow();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "booking.cancel",
        entity: "booking",
        entityId: bookingId,
        workOrderId: b.workOrderId,
        outcome: "accepted",
        reason,
      },
    ]);
    return row;
  });
}

export interface BookingRow {
  id: string;
  resourceId: string;
  resourceName: string;
  kind: ResourceKind;
  workOrderId: string;
  number: number;
  title: string;
  make: string;
  model: string;
  day: string;
  from: string;
  to: string;
  note: string;
  bookedBy: string;
  bookedAt: Date;
}

function bookingRows(db: Kysely<Database>, shopId: string, timeZone: string) {
  return db
    .selectFrom("bookings as b")
    .innerJoin("shop_resources as r", "r.id", "b.resource_id")
    .innerJoin("work_orders as w", "w.id", "b.work_order_id")
    .innerJoin("bikes as k", "k.id", "w.bike_id")
    .innerJoin("users as u", "u.id", "b.booked_by")
    .select([
      "b.id",
      "b.resource_id as resourceId",
      "r.name as resourceName",
      "r.kind",
      "w.id as workOrderId",
      "w.number",
      "w.title",
      "k.make",
      "k.model",
      ...localParts(timeZone),
      "b.note",
      "u.name as bookedBy",
      "b.booked_at as bookedAt",
    ])
    .where("b.shop_id", "=", shopId)
    .where("b.released_at", "is", null)
    .orderBy(sql`lower(b.during)`);
}

/** The live bookings of one resource in the week starting `monday` (shop zone). */
export async function listWeek(db: Kysely<Database>, shopId: string, resourceId: string, monday: string): Promise<BookingRow[]> {
  const { timeZone } = await shopOf(db, shopId);
  return bookingRows(db, shopId, timeZone)
    .where("b.resource_id", "=", resourceId)
    .where(
      sql<boolean>`b.during && tstzrange(${monday}::date::timestamp AT TIME ZONE ${timeZone}, ${addDays(monday, 7)}::date::timestamp AT TIME ZONE ${timeZone}, '[)')`,
    )
    .execute();
}

/** A work order's live bookings (optionally of one kind of resource, e.g. the dyno). */
export async function listWorkOrderBookings(
  db: Kysely<Database>,
  shopId: string,
  workOrderId: string,
  kind?: ResourceKind,
): Promise<BookingRow[]> {
  const { timeZone } = await shopOf(db, shopId);
  let q = bookingRows(db, shopId, timeZone).where("b.work_order_id", "=", workOrderId);
  if (kind) q = q.where("r.kind", "=", kind);
  return q.execute();
}

/** The shop's opening hours and zone, for the calendar page. */
export const shopHours = shopOf;

/** Open jobs of the shop that may be booked (not handed over or cancelled), newest number first. */
export async function listBookableJobs(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("work_orders as w")
    .innerJoin("bikes as k", "k.id", "w.bike_id")
    .select(["w.id", "w.number", "w.title", "k.make", "k.model"])
    .where("w.shop_id", "=", shopId)
    .where("w.status", "not in", [...CLOSED])
    .orderBy("w.number", "desc")
    .execute();
}

/**
 * Cancels a closed job's bookings still to come (the dyno tomorrow for a job handed over today, a
 * bay next week for a job cancelled), in the closing move's transaction, with the move as the
 * reason: the slots are free for other jobs, and the week plan no longer shows the job there.
 */
export async function cancelBookingsOfClosedJob(
  trx: Transaction<Database>,
  who: { shopId: string; userId: string },
  jobId: string,
  reason: string,
): Promise<number> {
  const ahead = await trx
    .selectFrom("bookings")
    .select("id")
    .where("shop_id", "=", who.shopId)
    .where("work_order_id", "=", jobId)
    .where("released_at", "is", null)
    .where(sql<boolean>`upper(during) > now()`)
    .orderBy("id")
    .forUpdate()
    .execute();
  for (const b of ahead) {
    await trx
      .insertInto("booking_cancellations")
      .values({ shop_id: who.shopId, booking_id: b.id, reason, cancelled_by: who.userId })
      .execute();
    await appendAudit(trx, [
      {
        shopId: who.shopId,
        actorId: who.userId,
        action: "booking.cancel",
        entity: "booking",
        entityId: b.id,
        workOrderId: jobId,
        outcome: "accepted",
        reason,
      },
    ]);
  }
  return ahead.length;
}
