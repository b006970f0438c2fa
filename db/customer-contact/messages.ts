import "server-only";
import { sql, type Kysely } from "kysely";
import { Refusal } from "@/lib/errors";
import type { Database } from "../schema";

// The message thread of a work order (table work_order_messages, append-only): the customer asks
// or replies, the office answers. A thread is "waiting for an answer" while its newest message is
// the customer's.

/** The work order, when it is one of this customer's bikes' (else refused as not found). */
export async function customersWorkOrder(db: Kysely<Database>, shopId: string, customerId: string | null, workOrderId: string) {
  const w = customerId
    ? await db
        .selectFrom("work_orders as w")
        .innerJoin("bikes as b", "b.id", "w.bike_id")
        .select(["w.id", "w.number"])
        .where("w.id", "=", workOrderId)
        .where("w.shop_id", "=", shopId)
        .where("b.customer_id", "=", customerId)
        .executeTakeFirst()
    : undefined;
  if (!w) throw new Refusal("No such job among your bikes.", 404);
  return w;
}

export async function addMessage(
  db: Kysely<Database>,
  m: { shopId: string; workOrderId: string; authorId: string; fromCustomer: boolean; body: string },
) {
  return db
    .insertInto("work_order_messages")
    .values({ shop_id: m.shopId, work_order_id: m.workOrderId, author_id: m.authorId, from_customer: m.fromCustomer, body: m.body })
    .returning(["id", "written_at as writtenAt"])
    .executeTakeFirstOrThrow();
}

/** Every message of the work order, oldest first, with who wrote it. */
export async function threadOf(db: Kysely<Database>, shopId: string, workOrderId: string) {
  return db
    .selectFrom("work_order_messages as m")
    .innerJoin("users as u", "u.id", "m.author_id")
    .select(["m.id", "m.body", "m.from_customer as fromCustomer", "m.written_at as writtenAt", "u.name as authorName"])
    .where("m.shop_id", "=", shopId)
    .where("m.work_order_id", "=", workOrderId)
    .orderBy("m.written_at")
    .orderBy("m.id")
    .execute();
}

/** The threads of the shop whose newest message is the customer's, longest waiting first. */
export async function unansweredThreads(db: Kysely<Database>, shopId: string) {
  const r = await sql<{
    workOrderId: string;
    number: number;
    title: string;
    customerName: string;
    make: string;
    model: string;
    body: string;
    writtenAt: Date;
  }>`
    SELECT last.work_order_id AS "workOrderId", w.number, w.title, c.name AS "customerName", b.make, b.model,
           last.body, last.written_at AS "writtenAt"
    FROM (
      SELECT DISTINCT ON (work_order_id) work_order_id, from_customer, body, written_at
      FROM work_order_messages WHERE shop_id = ${shopId}
      ORDER BY work_order_id, written_at DESC, id DESC
    ) last
    JOIN work_orders w ON w.id = last.work_order_id
    JOIN bikes b ON b.id = w.bike_id
    JOIN customers c ON c.id = b.customer_id
    WHERE last.from_customer
    ORDER BY last.written_at
  `.execute(db);
  return r.rows;
}

/** Where a customer's message is e-mailed: every active office sign-in of the shop. */
export async function officeAddresses(db: Kysely<Database>, shopId: string): Promise<string[]> {
  const rows = await db
    .selectFrom("users")
    .select("email")
    .where("shop_id", "=", shopId)
    .where("role", "=", "office")
    .where("active", "=", true)
    .orderBy("email")
    .execute();
  return rows.map((r) => r.email);
}

/** The work order of the office's shop (else refused as not found). */
export async function officeWorkOrder(db: Kysely<Database>, shopId: string, workOrderId: string): Promise<string> {
  const w = await db.selectFrom("work_orders").select("id").where("id", "=", workOrderId).where("shop_id", "=", shopId).executeTakeFirst();
  if (!w) throw new Refusal("Not found.", 404);
  return w.id;
}
