import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "../schema";

/** The shop's own settings: currency and tax rate for quotes, the torque unit the bench shows first. */
export async function shopSettings(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("shops")
    .select(["currency", "tax_rate_bp as taxRateBp", "torque_unit as torqueUnit"])
    .where("id", "=", shopId)
    .executeTakeFirstOrThrow();
}
