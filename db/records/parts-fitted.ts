import "server-only";
import { sql, type Kysely } from "kysely";
import type { Database } from "../schema";

/** What every list of parts fitted shows of a part (`parts_fitted as p`). */
export const partColumns = [
  "p.id",
  "p.part_number as partNumber",
  "p.description",
  "p.supplier",
  "p.serial",
  "p.batch",
  "p.quantity",
  "p.fitted_at as fittedAt",
] as const;

/**
 * The parts fitted to one work order of a shop, in the order they were fitted: with the step they
 * went in at, who fitted them, whether they were recorded at the bench, the sync's flag for the
 * supervisor (a serial number recorded twice, work on a closed job…) and any withdrawal. Read by the office's work
 * order page and the handover report.
 */
export async function partsOfWorkOrder(db: Kysely<Database>, shopId: string, workOrderId: string) {
  const rows = await db
    .selectFrom("parts_fitted as p")
    .leftJoin("template_steps as s", "s.id", "p.step_id")
    .leftJoin("users as u", "u.id", "p.fitted_by")
    .leftJoin("operations as o", "o.id", "p.operation_id")
    .leftJoin("withdrawals as wd", "wd.operation_id", "p.operation_id")
    .leftJoin("users as wu", "wu.id", "wd.withdrawn_by")
    .select([
      ...partColumns,
      "s.title as stepTitle",
      "u.name as fittedByName",
      "p.operation_id as operationId",
      "o.flag_reason as flagReason",
      "wu.name as withdrawnBy",
      "wd.device_time as withdrawnAt",
      "wd.reason as withdrawnReason",
    ])
    .where("p.work_order_id", "=", workOrderId)
    .where("p.shop_id", "=", shopId)
    .orderBy("p.fitted_at")
    // Two parts fitted in the same millisecond: in the order the tablet recorded them.
    .orderBy(sql`o.stamp COLLATE "C"`)
    .orderBy("p.id")
    .execute();
  return rows.map(({ operationId, withdrawnBy, withdrawnAt, withdrawnReason, ...p }) => ({
    ...p,
    atBench: operationId !== null,
    // withdrawn at the bench: it stays on the record, marked, and no longer counts
    withdrawn: withdrawnAt !== null ? { by: withdrawnBy ?? "", at: withdrawnAt, reason: withdrawnReason ?? "" } : null,
  }));
}
