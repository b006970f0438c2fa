import type { Kysely } from "kysely";
import type { Database } from "./schema";

export async function listCustomers(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("customers")
    .select(["id", "name", "email", "phone"])
    .where("shop_id", "=", shopId)
    .orderBy("name")
    .execute();
}
