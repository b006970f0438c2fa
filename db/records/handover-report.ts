import "server-only";
import { sql, type Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { countingRuns } from "@/lib/dyno/run-withdrawal";
import { listDynoRuns } from "./dyno";
import { partsOfWorkOrder } from "./parts-fitted";
import type { Database } from "../schema";
import { workOrdersWithBike } from "../shop/work-orders";
import { withdrawnEntries } from "./withdrawn-entries";

// Everything the handover build report shows, read for one work order of one shop.

/**
 * The work order (id, number, bike tag) when `user` may have its report: staff of the same shop,
 * or the customer who owns the bike. null otherwise (the caller answers 404 and shows nothing).
 */
export async function reportWorkOrderFor(
  db: Kysely<Database>,
  user: SessionUser,
  workOrderId: string,
): Promise<{ id: string; number: number; tagCode: string } | null> {
  let q = db
    .selectFrom("work_orders as w")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .select(["w.id", "w.number", "b.tag_code as tagCode"])
    .where("w.shop_id", "=", user.shopId)
    .where("w.id", "=", workOrderId);
  if (user.role === "customer") {
    if (!user.customerId) return null;
    q = q.where("b.customer_id", "=", user.customerId);
  }
  return (await q.executeTakeFirst()) ?? null;
}

export async function loadHandoverReport(db: Kysely<Database>, shopId: string, workOrderId: string) {
  const job = await workOrdersWithBike(db)
    .innerJoin("shops as s", "s.id", "w.shop_id")
    .select([
      "w.id",
      "w.number",
      "w.title",
      "w.status",
      "w.complaint",
      "w.intake_odometer_km as odometerKm",
      "s.name as shopName",
      "b.make",
      "b.model",
      "b.year",
      "b.tag_code as tagCode",
      "b.displacement_cc as displacementCc",
      "b.vin",
      "b.engine_number as engineNumber",
      "c.name as customerName",
      "m.name as mechanicName",
    ])
    .where("w.shop_id", "=", shopId)
    .where("w.id", "=", workOrderId)
    .executeTakeFirst();
  if (!job) return null;

  const procedures = await db
    .selectFrom("job_procedures as jp")
    .innerJoin("template_versions as tv", "tv.id", "jp.template_version_id")
    .select(["jp.id", "jp.template_version_id as versionId", "tv.name", "tv.version", "tv.example_only as exampleOnly"])
    .where("jp.work_order_id", "=", workOrderId)
    .orderBy("jp.position")
    .execute();
  const versionIds = procedures.map((p) => p.versionId);
  const steps = versionIds.length
    ? await db
        .selectFrom("template_steps")
        .select(["id", "template_version_id as versionId", "stage_key as stageKey", "stage_title as stageTitle", "title", "cautions"])
        .where("template_version_id", "in", versionIds)
        .orderBy("stage_position")
        .orderBy("position")
        .execute()
    : [];
  const completed = await db
    .selectFrom("step_completions as sc")
    .innerJoin("users as u", "u.id", "sc.completed_by")
    .select(["sc.step_id as stepId", "u.name as by", "sc.device_time as at"])
    .where("sc.work_order_id", "=", workOrderId)
    .where("sc.flagged", "=", false)
    .where(({ not, exists, selectFrom }) =>
      not(exists(selectFrom("withdrawals as x").select("x.id").whereRef("x.operation_id", "=", "sc.id"))),
    )
    .orderBy("sc.device_time")
    .execute();

  // withdrawn parts are listed with the other withdrawn entries, not as fitted
  const parts = (await partsOfWorkOrder(db, shopId, workOrderId)).filter((p) => !p.withdrawn);
  const withdrawn = await withdrawnEntries(db, shopId, { workOrderId });

  // current readings: those no later reading supersedes
  const readings = await db
    .selectFrom("measurements as m")
    .innerJoin("measurement_specs as s", "s.id", "m.spec_id")
    .innerJoin("template_steps as t", "t.id", "m.step_id")
    .select([
      "m.spec_id as specId",
      "m.reading_index as readingIndex",
      "m.value",
      "m.unit",
      "m.verdict",
      "s.label",
      "s.nominal",
      "s.min",
      "s.max",
      "s.unit as specUnit",
      "s.reading_labels as readingLabels",
      "s.geometry",
      "t.stage_position as stagePosition",
      "t.position as stepPosition",
    ])
    .where("m.work_order_id", "=", workOrderId)
    .where(({ not, exists, selectFrom }) =>
      not(exists(selectFrom("measurements as later").select("later.id").whereRef("later.supersedes_id", "=", "m.id"))),
    )
    .orderBy("t.stage_position")
    .orderBy("t.position")
    .orderBy("s.key")
    .orderBy("m.reading_index")
    .orderBy("m.device_time")
    .execute();

  const stepIds = steps.map((s) => s.id);
  const torqueSpecs = stepIds.length
    ? await db
        .selectFrom("torque_specs as ts")
        .select((eb) => [
          "ts.id",
          "ts.step_id as stepId",
          "ts.label",
          "ts.final_value as finalValue",
          "ts.unit",
          "ts.passes",
          "ts.angle_passes as anglePasses",
          "ts.pattern",
          "ts.bolt_count as boltCount",
          "ts.lubricant",
          "ts.torque_to_yield as torqueToYield",
          eb
            .selectFrom("torque_records as tr")
            .select(sql<number>`count(DISTINCT (tr.pass_index, tr.bolt))`.as("n"))
            .whereRef("tr.torque_spec_id", "=", "ts.id")
            .where("tr.work_order_id", "=", workOrderId)
            // a withdrawn bolt does not count: it must be done again
            .where(sql<boolean>`NOT EXISTS (SELECT 1 FROM withdrawals x WHERE x.operation_id = tr.id)`)
            .as("recorded"),
        ])
        .where("ts.step_id", "in", stepIds)
        .execute()
    : [];

  const signOffs = await db
    .selectFrom("sign_offs as so")
    .innerJoin("users as u", "u.id", "so.signed_by")
    .select([
      "so.id",
      "so.job_procedure_id as jobProcedureId",
      "so.stage_key as stageKey",
      "u.name as signedBy",
      "so.device_time as signedAt",
    ])
    .where("so.work_order_id", "=", workOrderId)
    .where(({ not, exists, selectFrom }) =>
      not(exists(selectFrom("withdrawals as x").select("x.id").whereRef("x.operation_id", "=", "so.id"))),
    )
    .orderBy("so.device_time")
    .execute();
  const decisions = signOffs.length
    ? await db
        .selectFrom("review_decisions as d")
        .innerJoin("users as u", "u.id", "d.decided_by")
        .select(["d.sign_off_id as signOffId", "d.decision", "d.reason", "u.name as decidedBy", "d.decided_at as decidedAt"])
        .where(
          "d.sign_off_id",
          "in",
          signOffs.map((s) => s.id),
        )
        .orderBy("d.decided_at")
        .execute()
    : [];

  // Withdrawn runs stay on record but do not go in the report.
  const runs = countingRuns(await listDynoRuns(db, shopId, workOrderId));
  return { job, procedures, steps, completed, parts, readings, torqueSpecs, signOffs, decisions, runs, withdrawn };
}

export type HandoverReportData = NonNullable<Awaited<ReturnType<typeof loadHandoverReport>>>;
