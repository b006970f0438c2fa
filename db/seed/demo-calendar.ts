import type { Kysely } from "kysely";
import type { Database } from "../schema";
import { demoUserId } from "./demo-lookups";

// The demo shop's calendar resources (invented): the dyno, two bays, a lift and one mechanic
// (Tomas). No bookings are seeded; the shop keeps the default opening hours (08:00–18:00, Mon–Fri).

const RESOURCES = [
  { kind: "dyno", name: "Dyno" },
  { kind: "bay", name: "Bay 1" },
  { kind: "bay", name: "Bay 2" },
  { kind: "lift", name: "Lift A" },
] as const;

export async function demoCalendarExists(db: Kysely<Database>, shopId: string): Promise<boolean> {
  return Boolean(await db.selectFrom("shop_resources").select("id").where("shop_id", "=", shopId).executeTakeFirst());
}

export async function seedDemoCalendar(db: Kysely<Database>, shopId: string): Promise<void> {
  const user = (email: string) => demoUserId(db, shopId, email);
  const office = await user("maren@gannet-street.test");
  const tomas = await user("tomas@gannet-street.test");
  await db
    .insertInto("shop_resources")
    .values([
      ...RESOURCES.map((r) => ({ shop_id: shopId, kind: r.kind, name: r.name, user_id: null, created_by: office })),
      { shop_id: shopId, kind: "mechanic" as const, name: "Tomas (mechanic)", user_id: tomas, created_by: office },
    ])
    .execute();
}
