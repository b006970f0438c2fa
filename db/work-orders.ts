import type { Kysely } from "kysely";
import type { Database } from "./schema";

// Work orders of one shop with their bike and customer, newest first.
export async function listWorkOrders(db: Kysely<Database>, shopId: string, opts: { limit?: number } = {}) {
  return db
    .selectFrom("work_orders as w")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .innerJoin("customers as c", "c.id", "b.customer_id")
    .leftJoin("users as m", "m.id", "w.assigned_mechanic_id")
    .select([
      "w.id",
      "w.number",
      "w.title",
      "w.status",
      "w.updated_at as updatedAt",
      "b.make",
      "b.model",
      "b.tag_code as tagCode",
      "c.name as customerName",
      "m.name as mechanicName",
    ])
    .where("w.shop_id", "=", shopId)
    .orderBy("w.number", "desc")
    .limit(opts.limit ?? 50)
    .execute();
}
