import type { Kysely } from "kysely";
import type { Database } from "../schema";
import { insertDemoBike } from "./demo-bike";
import { demoUserId } from "./demo-lookups";

// An invented customer with no sign-in yet, for the invitation, the message thread and progress
// updates (and their browser test): Hollis Penhale, bike tag GSW-1076, work order 1076 in build.
// Numbers 1077 and 1078 are kept for this subject.

export const DEMO_INVITEE = { name: "Hollis Penhale", email: "hollis.penhale@example.test", tag: "GSW-1076", number: 1076 } as const;

export async function seedDemoCustomerContact(db: Kysely<Database>, shopId: string): Promise<void> {
  const officeId = await demoUserId(db, shopId, "maren@gannet-street.test");
  const customer = await db
    .insertInto("customers")
    .values({ shop_id: shopId, name: DEMO_INVITEE.name, email: DEMO_INVITEE.email, phone: "+44 7700 901076" })
    .returning("id")
    .executeTakeFirstOrThrow();
  const bikeId = await insertDemoBike(db, shopId, customer.id, {
    make: "Skerry",
    model: "Twin 850 Scrambler",
    year: 2018,
    cc: 849,
    colour: "Sand",
    tag: DEMO_INVITEE.tag,
  });
  const wo = await db
    .insertInto("work_orders")
    .values({
      shop_id: shopId,
      bike_id: bikeId,
      number: DEMO_INVITEE.number,
      title: "Top-end refresh and cam timing check",
      status: "in_build",
      complaint: "Ticking from the head when warm and a flat spot at 5,000 rpm; wants the top end freshened.",
      intake_odometer_km: 24_076,
      assigned_mechanic_id: null,
      closed_at: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  await db
    .insertInto("work_order_transitions")
    .values({ work_order_id: wo.id, from_status: null, to_status: "in_build", by_user_id: officeId, note: "demo data" })
    .execute();
}
