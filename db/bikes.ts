import type { Kysely } from "kysely";
import type { Database } from "./schema";

// A customer's own bikes with their work orders (for the customer's own view).
export async function bikesOfCustomer(db: Kysely<Database>, shopId: string, customerId: string) {
  const bikes = await db
    .selectFrom("bikes")
    .select(["id", "make", "model", "year", "colour", "tag_code as tagCode"])
    .where("shop_id", "=", shopId)
    .where("customer_id", "=", customerId)
    .orderBy("make")
    .execute();
  const orders = bikes.length
    ? await db
        .selectFrom("work_orders")
        .select(["id", "bike_id as bikeId", "number", "title", "status", "updated_at as updatedAt"])
        .where("shop_id", "=", shopId)
        .where(
          "bike_id",
          "in",
          bikes.map((b) => b.id),
        )
        .orderBy("number", "desc")
        .execute()
    : [];
  return bikes.map((b) => ({ ...b, workOrders: orders.filter((o) => o.bikeId === b.id) }));
}
