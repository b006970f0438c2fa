import type { Kysely } from "kysely";
import type { Database } from "../schema";
import { insertDemoBike } from "./demo-bike";
import { DEMO_JOB_OWNER, demoCustomerId, demoUserId } from "./demo-lookups";

// An invented turbo conversion on the dyno with no runs yet, for trying the dyno page's logged-file
// import, tune versions and the job's turbo and fuel figures (and for the browser test of that
// journey, which needs a job of its own): work order 1050, tag GSW-0050, a Kestrel KR900 of Noor
// Haddad, assigned to the mechanic Tomas Reyes.
const BIKE = { number: 1050, tag: "GSW-0050", make: "Kestrel", model: "KR900 Turbo", year: 2015, cc: 899, colour: "Graphite" };

/** Writes job 1050 for the demo shop. */
export async function seedDemoTurboPlan(db: Kysely<Database>, shopId: string): Promise<void> {
  const user = (email: string) => demoUserId(db, shopId, email);
  const customerId = await demoCustomerId(db, shopId, DEMO_JOB_OWNER);
  const officeId = await user("maren@gannet-street.test");
  const bikeId = await insertDemoBike(db, shopId, customerId, BIKE);
  const wo = await db
    .insertInto("work_orders")
    .values({
      shop_id: shopId,
      bike_id: bikeId,
      number: BIKE.number,
      title: "Turbo conversion: plan the compressor and injectors, then tune",
      status: "on_dyno",
      complaint: "Wants a mild turbo conversion for the road, about 150 kW at the crank.",
      intake_odometer_km: 18_400,
      assigned_mechanic_id: await user("tomas@gannet-street.test"),
      closed_at: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  await db
    .insertInto("work_order_transitions")
    .values({ work_order_id: wo.id, from_status: null, to_status: "on_dyno", by_user_id: officeId, note: "demo data" })
    .execute();
}
