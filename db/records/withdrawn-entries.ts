import "server-only";
import { sql, type Kysely } from "kysely";
import { describeWithdrawn } from "@/lib/sync/withdrawals";
import type { Database } from "../schema";

/**
 * The entries withdrawn on a shop's work orders (one work order, or every work order of a bike),
 * oldest first (ties, as in one batch, in the order received): what each was and who recorded it, who withdrew it, when and why. Read by the
 * office's work order page, the bike record and the handover report; the entries themselves stay
 * on the record, marked.
 */
export async function withdrawnEntries(db: Kysely<Database>, shopId: string, where: { workOrderId: string } | { bikeId: string }) {
  let q = db
    .selectFrom("withdrawals as w")
    .innerJoin("operations as o", "o.id", "w.operation_id")
    .innerJoin("operations as wop", "wop.id", "w.id")
    .innerJoin("work_orders as wo", "wo.id", "w.work_order_id")
    .innerJoin("users as by", "by.id", "w.withdrawn_by")
    .innerJoin("users as author", "author.id", "o.author_id")
    .leftJoin("template_steps as st", (j) => j.on(sql<boolean>`st.id = (o.payload->>'stepId')::uuid`))
    .leftJoin("torque_records as t", "t.id", "o.id")
    .leftJoin("torque_specs as ts", "ts.id", "t.torque_spec_id")
    .leftJoin("parts_fitted as p", "p.operation_id", "o.id")
    .leftJoin("sign_offs as so", "so.id", "o.id")
    .leftJoin("job_procedures as jp", "jp.id", "so.job_procedure_id")
    .select((eb) => [
      "w.id",
      "w.operation_id as operationId",
      "o.kind",
      "wo.number as workOrderNumber",
      "author.name as recordedBy",
      "o.device_time as recordedAt",
      "by.name as withdrawnBy",
      "w.device_time as withdrawnAt",
      "w.reason",
      "st.title as stepTitle",
      "ts.label as specLabel",
      "t.pass_index as passIndex",
      "t.bolt",
      "p.part_number as partNumber",
      "p.description as partDescription",
      "p.serial",
      "p.batch",
      "p.quantity",
      eb
        .selectFrom("template_steps as x")
        .select("x.stage_title")
        .whereRef("x.template_version_id", "=", "jp.template_version_id")
        .whereRef("x.stage_key", "=", "so.stage_key")
        .limit(1)
        .as("stageTitle"),
    ])
    .where("wo.shop_id", "=", shopId);
  q = "workOrderId" in where ? q.where("w.work_order_id", "=", where.workOrderId) : q.where("wo.bike_id", "=", where.bikeId);
  const rows = await q.orderBy("w.device_time").orderBy("wop.seq").execute();
  return rows.map((r) => ({
    id: r.id,
    operationId: r.operationId,
    kind: r.kind,
    workOrderNumber: r.workOrderNumber,
    what: describeWithdrawn({
      kind: r.kind,
      stepTitle: r.stepTitle,
      torque:
        r.specLabel !== null && r.passIndex !== null && r.bolt !== null
          ? { specLabel: r.specLabel, passIndex: r.passIndex, bolt: r.bolt }
          : null,
      part:
        r.partNumber !== null
          ? { partNumber: r.partNumber, description: r.partDescription ?? "", serial: r.serial, batch: r.batch, quantity: r.quantity ?? 1 }
          : null,
      stageTitle: r.stageTitle,
    }),
    recordedBy: r.recordedBy,
    recordedAt: r.recordedAt,
    withdrawnBy: r.withdrawnBy,
    withdrawnAt: r.withdrawnAt,
    reason: r.reason,
  }));
}

export type WithdrawnEntry = Awaited<ReturnType<typeof withdrawnEntries>>[number];
