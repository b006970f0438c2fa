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

/** The shop's time zone (IANA name), for dates said in the shop's own calendar. */
export async function shopTimeZone(db: Kysely<Database>, shopId: string): Promise<string> {
  const s = await db.selectFrom("shops").select("time_zone as timeZone").where("id", "=", shopId).executeTakeFirstOrThrow();
  return s.timeZone;
}
