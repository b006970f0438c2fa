import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "../schema";

export async function recordEmail(
  db: Kysely<Database>,
  e: {
    shopId: string;
    workOrderId: string | null;
    kind: string;
    recipient: string;
    subject: string;
    messageId: string | null;
    error: string | null;
  },
) {
  await db
    .insertInto("outbound_emails")
    .values({
      shop_id: e.shopId,
      work_order_id: e.workOrderId,
      kind: e.kind,
      recipient: e.recipient,
      subject: e.subject,
      message_id: e.messageId,
      error: e.error,
    })
    .execute();
}

// Who to write to about a work order, and what to say it about.
export async function emailContext(db: Kysely<Database>, shopId: string, workOrderId: string) {
  return db
    .selectFrom("work_orders as w")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .innerJoin("customers as c", "c.id", "b.customer_id")
    .innerJoin("shops as s", "s.id", "w.shop_id")
    .select([
      "w.number",
      "w.title",
      "w.status",
      "b.make",
      "b.model",
      "b.tag_code as tagCode",
      "c.name as customerName",
      "c.email",
      "s.name as shopName",
      "s.currency",
    ])
    .where("w.id", "=", workOrderId)
    .where("w.shop_id", "=", shopId)
    .executeTakeFirst();
}

/** The latest move of the work order to `status` (what a status e-mail is about). */
export async function latestTransitionTo(db: Kysely<Database>, workOrderId: string, status: "ready") {
  const t = await db
    .selectFrom("work_order_transitions")
    .select("id")
    .where("work_order_id", "=", workOrderId)
    .where("to_status", "=", status)
    .orderBy("at", "desc")
    .orderBy("id", "desc")
    .executeTakeFirst();
  return t?.id ?? null;
}
