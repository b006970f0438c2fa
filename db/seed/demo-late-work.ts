import { randomUUID } from "node:crypto";
import type { Kysely } from "kysely";
import { formatStamp } from "@/lib/sync/hlc";
import type { Operation, OperationKind, OperationOf } from "@/lib/sync/operations";
import type { Database } from "../schema";
import { mergeBatch } from "../sync/merge";
import { insertDemoBike } from "./demo-bike";

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

/** Noor Haddad (the owner of the demo jobs beyond 1001–1010) and the first version of the bottom-end procedure. */
export async function demoBottomEndJobBasics(
  db: Kysely<Database>,
  shopId: string,
): Promise<{ customerId: string; bottomEndVersionId: string }> {
  const customer = await db
    .selectFrom("customers")
    .select("id")
    .where("shop_id", "=", shopId)
    .where("email", "=", "noor.haddad@example.test")
    .executeTakeFirstOrThrow();
  const version = await db
    .selectFrom("template_versions as v")
    .innerJoin("procedure_templates as t", "t.id", "v.template_id")
    .select("v.id")
    .where("t.shop_id", "=", shopId)
    .where("t.key", "=", "bottom-end-assembly")
    .orderBy("v.version")
    .executeTakeFirstOrThrow();
  return { customerId: customer.id, bottomEndVersionId: version.id };
}

/** Writes jobs 1030–1032 for the demo shop, looking up its people, customer and first bottom-end version. */
export async function seedDemoLateWork(db: Kysely<Database>, shopId: string): Promise<void> {
  const user = async (email: string) =>
    (await db.selectFrom("users").select("id").where("shop_id", "=", shopId).where("email", "=", email).executeTakeFirstOrThrow()).id;
  const { customerId, bottomEndVersionId } = await demoBottomEndJobBasics(db, shopId);
  const ids = {
    shopId,
    customerId,
    officeId: await user("maren@gannet-street.test"),
    mechanicId: await user("tomas@gannet-street.test"),
    bottomEndVersionId,
  };
  const jobIds: string[] = [];
  for (const b of BIKES) {
    const bikeId = await insertDemoBike(db, ids.shopId, ids.customerId, b);
    const wo = await db
      .insertInto("work_orders")
      .values({
        shop_id: ids.shopId,
        bike_id: bikeId,
        number: b.number,
        title: "Bottom-end rebuild after a spun bearing",
        status: "in_build",
        complaint: "Knocking under load after an oil-pressure drop; wants the bottom end rebuilt and measured.",
        intake_odometer_km: 31_000 + b.number,
        assigned_mechanic_id: ids.mechanicId,
        closed_at: null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await db
      .insertInto("work_order_transitions")
      .values({ work_order_id: wo.id, from_status: null, to_status: "in_build", by_user_id: ids.officeId, note: "demo data" })
      .execute();
    await db
      .insertInto("job_procedures")
      .values({ work_order_id: wo.id, template_version_id: ids.bottomEndVersionId, position: 0 })
      .execute();
    jobIds.push(wo.id);
  }
  await seedYesterdaysWork(db, ids, jobIds[0]);
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
  const start = Date.now() - 26 * 3600_000;
  const ops: Operation[] = [];
  const make = <K extends OperationKind>(kind: K, payload: OperationOf<K>["payload"]) => {
    const at = start + ops.length * 40_000;
    ops.push({
      id: randomUUID(),
      kind,
      workOrderId,
      authorId: ids.mechanicId,
      deviceId: DEVICE,
      deviceTime: new Date(at).toISOString(),
      stamp: formatStamp({ wallMs: at, counter: 0, deviceId: DEVICE }),
      payload,
    } as Operation);
  };
  for (const stepKey of ["bore-cyl-1", "piston-clearance", "ring-gap"]) {
    const specs = steps.filter((s) => s.stepKey === stepKey && s.specId !== null);
    for (const s of specs) {
      YESTERDAY[s.specKey!].forEach((value, readingIndex) =>
        make("measurement.recorded", { stepId: s.stepId, specId: s.specId!, readingIndex, value: String(value), unit: "mm" }),
      );
    }
    make("step.completed", { stepId: specs[0].stepId });
  }
  await mergeBatch(
    db,
    { id: mechanic.id, shopId: ids.shopId, role: "mechanic", name: mechanic.name, email: mechanic.email, customerId: null },
    { deviceId: DEVICE, cursor: null, operations: ops },
    { nowMs: start + ops.length * 40_000 },
  );
}
