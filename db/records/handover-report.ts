import "server-only";
import { notWithdrawn } from "./withdrawn";
import { sql, type Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { countingRuns } from "@/lib/dyno/run-withdrawal";
import type { WorkOrderStatus } from "@/lib/work-orders/status";
import { describeEntry, placeOfEntry } from "@/lib/review/flagged-work";
import { buildWorkOrderView } from "@/lib/work-order-record";
import { getJobSnapshot } from "../bench/jobs";
import { flaggedEntriesOf, placeLookups } from "../review/flagged-work";
import { loadOpenItems } from "./open-items";
import { overridesOf } from "./status-overrides";
import { listDynoRuns } from "./dyno";
import { partsOfWorkOrder } from "./parts-fitted";
import type { Database } from "../schema";
import { workOrdersWithBike } from "../shop/work-orders";
import { withdrawnEntries } from "./withdrawn-entries";
import { listTuneVersions } from "./tunes";
import { buildFiguresOf, newestRunBoost } from "./build-sheets";

// Everything the handover build report shows, read for one work order of one shop.

/**
 * The work order (id, number, bike tag) when `user` may have its report: staff of the same shop,
 * or the customer who owns the bike. null otherwise (the caller answers 404 and shows nothing).
 */
export async function reportWorkOrderFor(
  db: Kysely<Database>,
  user: SessionUser,
  workOrderId: string,
): Promise<{ id: string; number: number; tagCode: string; status: WorkOrderStatus } | null> {
  let q = db
    .selectFrom("work_orders as w")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .select(["w.id", "w.number", "b.tag_code as tagCode", "w.status"])
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
      "s.time_zone as timeZone",
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
  const templateSteps = versionIds.length
    ? await db
        .selectFrom("template_steps")
        .select(["id", "template_version_id as versionId", "stage_key as stageKey", "stage_title as stageTitle", "title", "cautions"])
        .where("template_version_id", "in", versionIds)
        .orderBy("stage_position")
        .orderBy("position")
        .execute()
    : [];
  // Whether each step is done, by the rules the bench and the build progress use (a step sent
  // back is open until it is done again): the work-order record view of the job's snapshot.
  const snapshot = await getJobSnapshot(db, { id: "", shopId, role: "office" }, workOrderId);
  const view = snapshot ? buildWorkOrderView(snapshot, [], Date.now()) : null;
  const names = new Map(
    (await db.selectFrom("users").select(["id", "name"]).where("shop_id", "=", shopId).execute()).map((u) => [u.id, u.name]),
  );
  const steps = templateSteps.map((s) => {
    const sv = view?.steps.find((v) => v.step.id === s.id);
    const last = snapshot?.state.completions.filter((c) => c.stepId === s.id).at(-1);
    return {
      ...s,
      done: sv?.done ?? false,
      reopenedReason: sv?.reopened?.reason ?? null,
      doneBy: sv?.done && last ? (names.get(last.completedBy) ?? "—") : null,
      doneAt: sv?.done && last ? last.deviceTime : null,
    };
  });
  const openItems = (await loadOpenItems(db, shopId, workOrderId)) ?? [];

  // withdrawn parts are listed with the other withdrawn entries, not as fitted
  const parts = (await partsOfWorkOrder(db, shopId, workOrderId)).filter((p) => !p.withdrawn);
  const withdrawn = await withdrawnEntries(db, shopId, { workOrderId });

  // Current readings: the database view current_measurements (one per spot: the latest stamp among
  // the readings no correction replaced), the definition every screen of the app reads.
  const readings = await db
    .selectFrom("current_measurements as m")
    .innerJoin("measurement_specs as s", "s.id", "m.spec_id")
    .innerJoin("template_steps as t", "t.id", "m.step_id")
    .leftJoin("reading_acceptances as a", "a.measurement_id", "m.id")
    .select([
      "m.id",
      "m.spec_id as specId",
      "m.reading_index as readingIndex",
      "m.value",
      "m.unit",
      "m.verdict",
      "m.flag_reason as flagReason",
      "a.justification as acceptedBecause",
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
    .orderBy("t.stage_position")
    .orderBy("t.position")
    .orderBy("s.key")
    .orderBy("m.reading_index")
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
            .where(notWithdrawn("tr.id"))
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
    .where(notWithdrawn("so.id"))
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

  // Flagged entries with the supervisor's acceptance, each with the step it belongs to.
  const flaggedByJob = await flaggedEntriesOf(db, shopId, [workOrderId]);
  const lookup = (await placeLookups(db, flaggedByJob)).get(workOrderId);
  const stepTitle = new Map(templateSteps.map((s) => [s.id, s.title]));
  const flagged = (flaggedByJob.get(workOrderId) ?? []).map((e) => {
    const stepId = lookup ? placeOfEntry(e, lookup).stepId : null;
    return {
      what: describeEntry(e.kind, e.payload),
      stepTitle: stepId ? (stepTitle.get(stepId) ?? null) : null,
      by: names.get(e.authorId) ?? "—",
      flagReason: e.flagReason,
      acceptance: e.acceptance
        ? {
            by: names.get(e.acceptance.acceptedBy) ?? "—",
            justification: e.acceptance.justification,
            // accepted on its own: a closed job's entry no sign-off could carry (db/review/entry-acceptance.ts)
            onItsOwn: e.acceptance.decisionId === null,
          }
        : null,
    };
  });

  // The office's overrides: moves made while items were open, with the reason and those items.
  const overrides = await overridesOf(db, shopId, workOrderId);

  return {
    job,
    procedures,
    steps,
    parts,
    readings,
    torqueSpecs,
    signOffs,
    decisions,
    runs,
    flagged,
    overrides,
    openItems,
    withdrawn,
    tunes: await listTuneVersions(db, shopId, workOrderId),
    // the build's own figures from its readings, beside the build sheet's targets
    buildFigures: (await buildFiguresOf(db, shopId, workOrderId, newestRunBoost(runs)?.kpa ?? null)).figures,
  };
}

export type HandoverReportData = NonNullable<Awaited<ReturnType<typeof loadHandoverReport>>>;
