import { randomUUID } from "node:crypto";
import type { Kysely } from "kysely";
import { storeHandoverCopy } from "@/app/_server/frozen-report";
import { handOver } from "@/db/office/invoices";
import { loadOpenItems } from "@/db/records/open-items";
import { decideOnSignOff } from "@/db/review/decide";
import type { Database } from "@/db/schema";
import { moveWorkOrder } from "@/db/shop/work-orders";
import { createTemplateVersion } from "@/db/templates/versions";
import type { TemplateDocumentInput } from "@/lib/procedures/template-schema";
import type { Operation } from "@/lib/sync/operations";
import type { WorkOrderStatus } from "@/lib/work-orders/status";
import { Tablet } from "../../bench/sync-ops";
import { asUser, sync } from "./review-bench";
import { createShopFixture } from "./shop-fixture";

// A small invented procedure for the gates and the closed record: two stages, three steps, one
// measurement with two readings (limits 0.10 to 0.20 mm). A job on it, in a state of our choice,
// with an approved quote (the final invoice needs one) and its deposit paid.
export const CLOSE_OUT_TEMPLATE: TemplateDocumentInput = {
  format: "benchtag-template",
  formatVersion: 1,
  key: "close-out-check",
  name: "Close-out check",
  stages: [
    {
      key: "check",
      title: "Check the gap",
      steps: [
        {
          key: "measure-gap",
          title: "Measure the gap",
          measurements: [{ key: "gap", label: "Cover gap", min: 0.1, max: 0.2, unit: "mm", readingLabels: ["Left", "Right"] }],
        },
        { key: "fit-cover", title: "Fit the cover" },
      ],
    },
    { key: "close", title: "Close up", steps: [{ key: "seal", title: "Seal and label" }] },
  ],
};

export async function closeOutJob(db: Kysely<Database>, opts: { status?: WorkOrderStatus } = {}) {
  const fx = await createShopFixture(db);
  const { versionId } = await createTemplateVersion(db, fx.shopId, CLOSE_OUT_TEMPLATE, fx.users.office.id);
  const wo = await db
    .insertInto("work_orders")
    .values({
      shop_id: fx.shopId,
      bike_id: fx.bike.id,
      number: 2,
      title: "Close-out job",
      status: opts.status ?? "on_dyno",
      intake_odometer_km: 1200,
      assigned_mechanic_id: fx.users.mechanic.id,
      closed_at: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  const jp = await db
    .insertInto("job_procedures")
    .values({ work_order_id: wo.id, template_version_id: versionId, position: 0 })
    .returning("id")
    .executeTakeFirstOrThrow();
  const quote = await db
    .insertInto("quotes")
    .values({
      shop_id: fx.shopId,
      work_order_id: wo.id,
      version: 1,
      status: "approved",
      currency: "EUR",
      tax_rate_bp: 2000,
      subtotal_minor: 10000,
      tax_minor: 2000,
      total_minor: 12000,
      deposit_minor: 3000,
      created_by: fx.users.office.id,
      sent_at: new Date(),
      approved_at: new Date(),
      approved_by: fx.users.customer.id,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  await db
    .insertInto("deposits")
    .values({
      shop_id: fx.shopId,
      work_order_id: wo.id,
      quote_id: quote.id,
      amount_minor: 3000,
      currency: "EUR",
      payment_intent_id: null,
      status: "paid",
      paid_at: new Date(),
    })
    .execute();
  const steps = Object.fromEntries(
    (await db.selectFrom("template_steps").select(["id", "key"]).where("template_version_id", "=", versionId).execute()).map((s) => [
      s.key,
      s.id,
    ]),
  ) as Record<"measure-gap" | "fit-cover" | "seal", string>;
  const spec = await db.selectFrom("measurement_specs").select("id").where("step_id", "=", steps["measure-gap"]).executeTakeFirstOrThrow();
  const users = { mech: asUser(fx.users.mechanic), sup: asUser(fx.users.supervisor), office: asUser(fx.users.office) };
  const tablet = new Tablet(`tablet-${randomUUID().slice(0, 8)}`, users.mech.id, wo.id);
  const stages = { check: { jobProcedureId: jp.id, stageKey: "check" }, close: { jobProcedureId: jp.id, stageKey: "close" } };
  return { fx, workOrderId: wo.id, jobProcedureId: jp.id, steps, specId: spec.id, users, tablet, stages };
}

export type CloseOutJob = Awaited<ReturnType<typeof closeOutJob>>;

/** The bench work of a stage as the tablet sends it: readings (check stage), completions, the sign-off. */
export function stageWork(job: CloseOutJob, stage: "check" | "close", gap: [number, number] = [0.15, 0.16]) {
  const t = job.tablet;
  const ops: Operation[] =
    stage === "check"
      ? [
          t.read(job.steps["measure-gap"], job.specId, 0, gap[0]),
          t.read(job.steps["measure-gap"], job.specId, 1, gap[1]),
          t.complete(job.steps["measure-gap"]),
          t.complete(job.steps["fit-cover"]),
        ]
      : [t.complete(job.steps.seal)];
  const signOff = t.make("stage.signed-off", job.stages[stage]);
  return { ops: [...ops, signOff], signOff };
}

/** Works both stages at the bench and has the supervisor approve both: nothing left open. */
export async function finishEverything(db: Kysely<Database>, job: CloseOutJob) {
  const signOffs: string[] = [];
  for (const stage of ["check", "close"] as const) {
    const w = stageWork(job, stage);
    await sync(db, job.users.mech, job.tablet, w.ops);
    const d = await decideOnSignOff(db, job.users.sup, w.signOff.id, {
      decision: "approved",
      expectedDecisionId: null,
      acceptances: [],
      flagAcceptances: [],
    });
    if (!d.ok) throw new Error(d.reason);
    signOffs.push(w.signOff.id);
  }
  return signOffs;
}

/** Ready then handed over, each with the office's written override when items are open; the handover stores the report (revision 1). */
export async function handOverByOverride(
  db: Kysely<Database>,
  job: CloseOutJob,
  reason = "Customer needs the bike back for a race weekend",
) {
  const overrideOf = async () => {
    const keys = (await loadOpenItems(db, job.fx.shopId, job.workOrderId))!.map((i) => i.key);
    return keys.length ? { reason, openItemKeys: keys } : null;
  };
  await moveWorkOrder(db, job.fx.shopId, job.users.office.id, job.workOrderId, "ready", { override: await overrideOf() });
  return handOver(db, job.fx.shopId, job.users.office.id, job.workOrderId, {
    override: await overrideOf(),
    storeReport: (trx) => storeHandoverCopy(trx, job.fx.shopId, job.workOrderId, job.users.office.id),
  });
}
