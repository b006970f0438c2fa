import { randomUUID } from "node:crypto";
import type { Kysely } from "kysely";
import { addDays, dayIn } from "@/lib/aftercare/reminders";
import type { Database } from "../schema";
import { insertDemoBike } from "./demo-bike";
import { demoTablet, sendDemoWork } from "./demo-tablet";

// Invented jobs for come-backs and reminders: work orders 1040 and 1041, tags GSW-1040 and
// GSW-1041, owner Ida Brannock (all invented). Both ran the demo bottom-end and first-start
// procedures and were handed over: 1040 nineteen days ago (readings and a batch of rod bearings on
// record; the bike to scan for a come-back), 1041 forty days ago (its run-in check overdue, its
// first service coming up). The first-start template carries two run-in reminder lines.

const BIKES = [
  { number: 1040, tag: "GSW-1040", make: "Tern", model: "Velo 750", year: 2018, cc: 749, colour: "Teal", daysAgo: 19 },
  { number: 1041, tag: "GSW-1041", make: "Ardley", model: "Six Hundred", year: 2016, cc: 599, colour: "Cream", daysAgo: 40 },
];
const DEVICE = "demo-tablet-4";
// Readings per spec key (mm), invented, inside the demo template's limits.
const READINGS: Record<string, number[]> = {
  "ptw-1": [0.062],
  "ptw-2": [0.059],
  "top-ring-gap": [0.4, 0.41, 0.42, 0.41],
};
/** Run-in lines of the first-start template: after so many days, or at so many km, whichever first (example figures). */
export const DEMO_RUN_IN_LINES = [
  { label: "Run-in check and first oil change", afterDays: 30, afterKm: 800 },
  { label: "First service", afterDays: 180, afterKm: 5000 },
];

export async function demoAftercareExists(db: Kysely<Database>, shopId: string): Promise<boolean> {
  const row = await db.selectFrom("work_orders").select("id").where("shop_id", "=", shopId).where("number", "=", 1040).executeTakeFirst();
  return Boolean(row);
}

export async function seedDemoAftercare(db: Kysely<Database>, shopId: string): Promise<void> {
  const user = async (email: string) =>
    await db
      .selectFrom("users")
      .select(["id", "name", "email"])
      .where("shop_id", "=", shopId)
      .where("email", "=", email)
      .executeTakeFirstOrThrow();
  const office = await user("maren@gannet-street.test");
  const mechanic = await user("tomas@gannet-street.test");
  const template = async (key: string) =>
    db
      .selectFrom("template_versions as v")
      .innerJoin("procedure_templates as t", "t.id", "v.template_id")
      .select(["v.id", "t.id as templateId"])
      .where("t.shop_id", "=", shopId)
      .where("t.key", "=", key)
      .orderBy("v.version")
      .executeTakeFirstOrThrow();
  const bottom = await template("bottom-end-assembly");
  const firstStart = await template("first-start-run-in");
  await db
    .insertInto("run_in_reminder_lines")
    .values(
      DEMO_RUN_IN_LINES.map((l, position) => ({
        shop_id: shopId,
        template_id: firstStart.templateId,
        position,
        label: l.label,
        after_days: l.afterDays,
        after_km: l.afterKm,
      })),
    )
    .execute();
  const lines = await db
    .selectFrom("run_in_reminder_lines")
    .select("id")
    .where("template_id", "=", firstStart.templateId)
    .orderBy("position")
    .execute();
  const customer = await db
    .insertInto("customers")
    .values({ shop_id: shopId, name: "Ida Brannock", email: "ida.brannock@example.test", phone: "+44 7700 900505" })
    .returning("id")
    .executeTakeFirstOrThrow();
  const today = dayIn("Europe/London");
  for (const b of BIKES) {
    const bikeId = await insertDemoBike(db, shopId, customer.id, b);
    const handedOver = new Date(Date.now() - b.daysAgo * 86_400_000);
    const km = 14_000 + b.number;
    const wo = await db
      .insertInto("work_orders")
      .values({
        shop_id: shopId,
        bike_id: bikeId,
        number: b.number,
        title: "Top-end and bottom-end refresh, first start",
        status: "in_build",
        complaint: "Rattle at idle and smoke on the overrun; wants the engine freshened for a season of touring.",
        intake_odometer_km: km,
        assigned_mechanic_id: mechanic.id,
        closed_at: null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await db
      .insertInto("work_order_transitions")
      .values({
        work_order_id: wo.id,
        from_status: null,
        to_status: "in_build",
        by_user_id: office.id,
        note: "demo data",
        at: new Date(handedOver.getTime() - 7 * 86_400_000),
      })
      .execute();
    for (const [position, v] of [bottom.id, firstStart.id].entries())
      await db.insertInto("job_procedures").values({ work_order_id: wo.id, template_version_id: v, position }).execute();
    await seedBuild(db, shopId, mechanic, wo.id, handedOver.getTime() - 3 * 86_400_000, b.number);
    await db.updateTable("work_orders").set({ status: "handed_over", closed_at: handedOver }).where("id", "=", wo.id).execute();
    await db
      .insertInto("work_order_transitions")
      .values({
        work_order_id: wo.id,
        from_status: "in_build",
        to_status: "handed_over",
        by_user_id: office.id,
        note: "demo data",
        at: handedOver,
      })
      .execute();
    const handoverDay = addDays(today, -b.daysAgo);
    await db
      .insertInto("service_reminders")
      .values(
        DEMO_RUN_IN_LINES.map((l, i) => ({
          shop_id: shopId,
          work_order_id: wo.id,
          label: l.label,
          due_on: addDays(handoverDay, l.afterDays),
          due_odometer_km: km + l.afterKm,
          from_line_id: lines[i].id,
          created_by: office.id,
          created_at: handedOver,
        })),
      )
      .execute();
  }
}

/** The build's readings and a batch of rod bearings, sent through the sync as a tablet would have. */
async function seedBuild(
  db: Kysely<Database>,
  shopId: string,
  mechanic: { id: string; name: string; email: string },
  workOrderId: string,
  start: number,
  number: number,
): Promise<void> {
  const specs = await db
    .selectFrom("job_procedures as jp")
    .innerJoin("template_steps as s", "s.template_version_id", "jp.template_version_id")
    .leftJoin("measurement_specs as m", "m.step_id", "s.id")
    .select(["s.id as stepId", "s.key as stepKey", "m.id as specId", "m.key as specKey"])
    .where("jp.work_order_id", "=", workOrderId)
    .where("s.key", "in", ["piston-clearance", "ring-gap", "rod-bolts"])
    .execute();
  const tablet = demoTablet(workOrderId, mechanic.id, DEVICE, start);
  const make = tablet.make;
  for (const s of specs) {
    if (!s.specId || !READINGS[s.specKey!]) continue;
    READINGS[s.specKey!].forEach((value, readingIndex) =>
      make("measurement.recorded", { stepId: s.stepId, specId: s.specId!, readingIndex, value: String(value), unit: "mm" }),
    );
  }
  const rodStep = specs.find((s) => s.stepKey === "rod-bolts")!;
  make("part.fitted", {
    partFittedId: randomUUID(),
    stepId: rodStep.stepId,
    partNumber: "RB-2207",
    description: "Rod bearing shells, standard size",
    batch: number === 1040 ? "LOT-26-0412" : "LOT-26-0388",
    quantity: 4,
    supplier: "Fenwick Bearings",
  });
  await sendDemoWork(db, shopId, mechanic, tablet, DEVICE);
}
