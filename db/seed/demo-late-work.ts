import type { Kysely } from "kysely";
import type { Database } from "../schema";
import { insertDemoBike, type DemoBike } from "./demo-bike";
import { DEMO_JOB_OWNER, demoCustomerId, demoUserId, firstTemplateVersionId } from "./demo-lookups";
import { demoTablet, sendDemoWork } from "./demo-tablet";

// Three invented jobs for trying what the sync does with work it cannot store at once (and for
// the browser tests of it): work orders 1030–1032, tags GSW-0030…GSW-0032, all in build on the
// demo bottom-end procedure and assigned to the mechanic Tomas Reyes.
// - 1030: the first three measuring steps were recorded and synced yesterday; the last one
//   (main bearing oil clearance) and the stage's sign-off are still to do — the job to reassign
//   while a tablet works it offline;
// - 1031: fresh, for a refused entry (a note the server cannot store) and its discard;
// - 1032: fresh, for a supervisor's timer override refused after a role change, and sent again.

const BIKES = [
  { number: 1030, tag: "GSW-0030", make: "Petrel", model: "Café 750", year: 2016, cc: 749, colour: "Silver" },
  { number: 1031, tag: "GSW-0031", make: "Halden", model: "Scrambler 800", year: 2019, cc: 798, colour: "Olive" },
  { number: 1032, tag: "GSW-0032", make: "Ardley", model: "S2 Roadster", year: 2010, cc: 996, colour: "Orange" },
];

const DEVICE = "demo-tablet-3";
// Readings of 1030 taken yesterday (mm), per spec key, one per reading label. Invented.
const YESTERDAY: Record<string, number[]> = {
  "bore-1": [76.004, 76.005, 76.004, 76.006, 76.005, 76.004],
  "ptw-1": [0.061],
  "ptw-2": [0.06],
  "top-ring-gap": [0.42, 0.41, 0.43, 0.42],
};

/** Whether jobs 1030–1032 are on file (a database seeded before they existed gets them on the next seed). */
export async function demoLateWorkExists(db: Kysely<Database>, shopId: string): Promise<boolean> {
  const row = await db
    .selectFrom("work_orders")
    .select("id")
    .where("shop_id", "=", shopId)
    .where("number", "=", BIKES[0].number)
    .executeTakeFirst();
  return Boolean(row);
}

/** Writes jobs 1030–1032 for the demo shop, on its first bottom-end version, assigned to Tomas Reyes. */
export async function seedDemoLateWork(db: Kysely<Database>, shopId: string): Promise<void> {
  const jobIds = await insertAssignedDemoJobs(db, shopId, BIKES, ["bottom-end-assembly"], "Bottom-end rebuild after a spun bearing");
  const mechanicId = await demoUserId(db, shopId, "tomas@gannet-street.test");
  await seedYesterdaysWork(db, { shopId, mechanicId }, jobIds[0]);
}

/**
 * Invented bikes of Noor Haddad, each with a job in build on the first versions of the given
 * demo templates, assigned to the mechanic Tomas Reyes; returns the jobs' ids in order.
 */
export async function insertAssignedDemoJobs(
  db: Kysely<Database>,
  shopId: string,
  bikes: ReadonlyArray<DemoBike & { number: number }>,
  templateKeys: readonly string[],
  title: string,
): Promise<string[]> {
  const customerId = await demoCustomerId(db, shopId, DEMO_JOB_OWNER);
  const versionIds: string[] = [];
  for (const key of templateKeys) versionIds.push(await firstTemplateVersionId(db, shopId, key));
  const officeId = await demoUserId(db, shopId, "maren@gannet-street.test");
  const mechanicId = await demoUserId(db, shopId, "tomas@gannet-street.test");
  const jobIds: string[] = [];
  for (const b of bikes) {
    const bikeId = await insertDemoBike(db, shopId, customerId, b);
    const wo = await db
      .insertInto("work_orders")
      .values({
        shop_id: shopId,
        bike_id: bikeId,
        number: b.number,
        title,
        status: "in_build",
        complaint: "Knocking under load after an oil-pressure drop; wants the bottom end rebuilt and measured.",
        intake_odometer_km: 31_000 + b.number,
        assigned_mechanic_id: mechanicId,
        closed_at: null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await db
      .insertInto("work_order_transitions")
      .values({ work_order_id: wo.id, from_status: null, to_status: "in_build", by_user_id: officeId, note: "demo data" })
      .execute();
    for (const [position, templateVersionId] of versionIds.entries()) {
      await db.insertInto("job_procedures").values({ work_order_id: wo.id, template_version_id: templateVersionId, position }).execute();
    }
    jobIds.push(wo.id);
  }
  return jobIds;
}

/** Job 1030's first three measuring steps, sent through the sync as the tablet would have sent them yesterday. */
async function seedYesterdaysWork(db: Kysely<Database>, ids: { shopId: string; mechanicId: string }, workOrderId: string): Promise<void> {
  const steps = await db
    .selectFrom("job_procedures as jp")
    .innerJoin("template_steps as s", "s.template_version_id", "jp.template_version_id")
    .leftJoin("measurement_specs as m", "m.step_id", "s.id")
    .select(["s.id as stepId", "s.key as stepKey", "m.id as specId", "m.key as specKey"])
    .where("jp.work_order_id", "=", workOrderId)
    .where("s.key", "in", ["bore-cyl-1", "piston-clearance", "ring-gap"])
    .orderBy("s.position")
    .orderBy("m.key")
    .execute();
  const mechanic = await db.selectFrom("users").select(["id", "name", "email"]).where("id", "=", ids.mechanicId).executeTakeFirstOrThrow();
  const tablet = demoTablet(workOrderId, ids.mechanicId, DEVICE, Date.now() - 26 * 3600_000);
  const make = tablet.make;
  for (const stepKey of ["bore-cyl-1", "piston-clearance", "ring-gap"]) {
    const specs = steps.filter((s) => s.stepKey === stepKey && s.specId !== null);
    for (const s of specs) {
      YESTERDAY[s.specKey!].forEach((value, readingIndex) =>
        make("measurement.recorded", { stepId: s.stepId, specId: s.specId!, readingIndex, value: String(value), unit: "mm" }),
      );
    }
    make("step.completed", { stepId: specs[0].stepId });
  }
  await sendDemoWork(db, ids.shopId, mechanic, tablet, DEVICE);
}

/** Noor Haddad (the owner of the demo jobs beyond 1001–1010) and the first version of the bottom-end procedure. */
export async function demoBottomEndJobBasics(
  db: Kysely<Database>,
  shopId: string,
): Promise<{ customerId: string; bottomEndVersionId: string }> {
  return {
    customerId: await demoCustomerId(db, shopId, DEMO_JOB_OWNER),
    bottomEndVersionId: await firstTemplateVersionId(db, shopId, "bottom-end-assembly"),
  };
}
