import "server-only";
import { sql, type Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { dayIn, dayLabel } from "@/lib/aftercare/reminders";
import { Refusal } from "@/lib/errors";
import { STATUS_LABELS, type WorkOrderStatus } from "@/lib/work-orders/status";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";
import { shopTimeZone } from "../shop/settings";

// The day the office promised the bike back. Each change is a new record (who, when); the newest
// counts. A job is late when that day has passed and the bike is not yet ready or handed over.

const NOT_LATE: WorkOrderStatus[] = ["ready", "handed_over", "cancelled"];

export async function setPromisedDate(db: Kysely<Database>, user: SessionUser, workOrderId: string, promisedOn: string) {
  return db.transaction().execute(async (trx) => {
    const wo = await trx
      .selectFrom("work_orders as w")
      .innerJoin("shops as s", "s.id", "w.shop_id")
      .select(["w.id", "w.number", "w.status", "s.time_zone as timeZone"])
      .where("w.id", "=", workOrderId)
      .where("w.shop_id", "=", user.shopId)
      .forUpdate("w")
      .executeTakeFirst();
    if (!wo) throw new Refusal("No such job in this shop.", 404);
    if (wo.status === "handed_over" || wo.status === "cancelled")
      throw new Refusal(`Job #${wo.number} is ${STATUS_LABELS[wo.status].toLowerCase()}: a closed job takes no promised date.`, 409);
    const today = dayIn(wo.timeZone);
    if (promisedOn < today) {
      const message = `Promised date ${dayLabel(promisedOn)} is in the past: promise today (${dayLabel(today)}) or later.`;
      throw new Refusal(message, 422, [{ path: "promisedOn", message }]);
    }
    const row = await trx
      .insertInto("work_order_promises")
      .values({ shop_id: user.shopId, work_order_id: workOrderId, promised_on: promisedOn, set_by: user.id })
      .returning(["id", "set_at as setAt"])
      .executeTakeFirstOrThrow();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "work_order.promise",
        entity: "work_order",
        entityId: workOrderId,
        workOrderId,
        outcome: "accepted",
        detail: { promisedOn },
      },
    ]);
    return row;
  });
}

/** The newest promise per work order of the shop. */
function latestPromises(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("work_order_promises as p")
    .innerJoin("users as u", "u.id", "p.set_by")
    .distinctOn("p.work_order_id")
    .select(["p.work_order_id as workOrderId", sql<string>`p.promised_on::text`.as("promisedOn"), "u.name as setBy", "p.set_at as setAt"])
    .where("p.shop_id", "=", shopId)
    .orderBy("p.work_order_id")
    .orderBy("p.set_at", "desc")
    .orderBy("p.id", "desc");
}

/** A work order's promised date (the newest record), or null. */
export async function promisedDateOf(db: Kysely<Database>, shopId: string, workOrderId: string) {
  return (await latestPromises(db, shopId).where("p.work_order_id", "=", workOrderId).executeTakeFirst()) ?? null;
}

export interface LateJob {
  workOrderId: string;
  number: number;
  title: string;
  status: WorkOrderStatus;
  make: string;
  model: string;
  promisedOn: string;
  daysLate: number;
  setBy: string;
}

/** Jobs whose promised day has passed (shop's today) and are not yet ready, most late first. */
export async function listLateJobs(db: Kysely<Database>, shopId: string): Promise<LateJob[]> {
  const today = dayIn(await shopTimeZone(db, shopId));
  return db
    .with("latest", () => latestPromises(db, shopId))
    .selectFrom("latest as p")
    .innerJoin("work_orders as w", "w.id", "p.workOrderId")
    .innerJoin("bikes as k", "k.id", "w.bike_id")
    .select([
      "w.id as workOrderId",
      "w.number",
      "w.title",
      "w.status",
      "k.make",
      "k.model",
      "p.promisedOn",
      sql<number>`(${today}::date - p."promisedOn"::date)`.as("daysLate"),
      "p.setBy",
    ])
    .where("w.status", "not in", NOT_LATE)
    .where(sql<boolean>`p."promisedOn"::date < ${today}::date`)
    .orderBy(sql`p."promisedOn"`)
    .orderBy("w.number")
    .execute();
}

/** Whether a work order is closed (handed over or cancelled) and its promised date, for its office page. */
export async function promiseOfWorkOrder(db: Kysely<Database>, shopId: string, workOrderId: string) {
  const wo = await db
    .selectFrom("work_orders")
    .select("status")
    .where("id", "=", workOrderId)
    .where("shop_id", "=", shopId)
    .executeTakeFirstOrThrow();
  return { closed: wo.status === "handed_over" || wo.status === "cancelled", promised: await promisedDateOf(db, shopId, workOrderId) };
}
