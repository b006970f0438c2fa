import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "../schema";

/**
 * The office's overrides on a work order, oldest first: each move made while items were open
 * (to ready or handed over), who made it, when, the reason written and the open items at that
 * moment. Read by the work order page, the build report and the customer's e-mail.
 */
export async function overridesOf(db: Kysely<Database>, shopId: string, workOrderId: string) {
  return db
    .selectFrom("status_overrides as o")
    .innerJoin("users as u", "u.id", "o.by_user_id")
    .select(["o.id", "o.from_status as from", "o.to_status as to", "o.reason", "o.open_items as openItems", "o.at", "u.name as byName"])
    .where("o.work_order_id", "=", workOrderId)
    .where("o.shop_id", "=", shopId)
    .orderBy("o.at")
    .execute();
}
