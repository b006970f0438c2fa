import type { Kysely } from "kysely";
import type { Database } from "./schema";

// Work orders joined to their bike (b), its owner (c) and the assigned mechanic (m, may be null):
// the starting point of every page that shows a job with its bike. Callers add the shop filter.
export function workOrdersWithBike(db: Kysely<Database>) {
  return db
    .selectFrom("work_orders as w")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .innerJoin("customers as c", "c.id", "b.customer_id")
    .leftJoin("users as m", "m.id", "w.assigned_mechanic_id");
}
