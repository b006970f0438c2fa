import "server-only";
import { sql, type Kysely } from "kysely";
import { readingLabelOf } from "@/lib/review/stage-review";
import type { ReadingCsvRow } from "@/lib/records/readings-csv";
import type { Database } from "../schema";
import { partColumns } from "./parts-fitted";
import { withdrawnEntries } from "./withdrawn-entries";

// Everything the shop knows about one bike: owner, every work order, parts fitted, readings.
export async function bikeRecord(db: Kysely<Database>, shopId: string, bikeId: string) {
  const bike = await db
    .selectFrom("bikes as b")
    .innerJoin("customers as c", "c.id", "b.customer_id")
    .select([
      "b.id",
      "b.make",
      "b.model",
      "b.year",
      "b.vin",
      "b.engine_number as engineNumber",
      "b.displacement_cc as displacementCc",
      "b.colour",
      "b.tag_code as tagCode",
      "b.notes",
      "c.id as customerId",
      "c.name as customerName",
      "c.email as customerEmail",
      "c.phone as customerPhone",
    ])
    .where("b.id", "=", bikeId)
    .where("b.shop_id", "=", shopId)
    .executeTakeFirst();
  if (!bike) return null;
  const workOrders = await db
    .selectFrom("work_orders")
    .select(["id", "number", "title", "status", "intake_odometer_km as odometerKm", "created_at as createdAt", "closed_at as closedAt"])
    .where("bike_id", "=", bikeId)
    .where("shop_id", "=", shopId)
    .orderBy("number", "desc")
    .execute();
  const parts = await db
    .selectFrom("parts_fitted as p")
    .innerJoin("work_orders as w", "w.id", "p.work_order_id")
    .leftJoin("template_steps as s", "s.id", "p.step_id")
    .leftJoin("withdrawals as wd", "wd.operation_id", "p.operation_id")
    .select([...partColumns, "w.number as workOrderNumber", "s.title as stepTitle", "wd.reason as withdrawnReason"])
    .where("w.bike_id", "=", bikeId)
    .where("p.shop_id", "=", shopId)
    .orderBy("p.fitted_at", "desc")
    .execute();
  const measurements = await db
    .selectFrom("measurements as m")
    .innerJoin("work_orders as w", "w.id", "m.work_order_id")
    .innerJoin("measurement_specs as ms", "ms.id", "m.spec_id")
    .select(({ exists, selectFrom }) => [
      "m.id",
      "w.number as workOrderNumber",
      "ms.label",
      "m.reading_index as readingIndex",
      "m.value",
      "m.unit",
      "m.verdict",
      "m.device_time as at",
      "ms.min",
      "ms.max",
      // every reading ever taken is kept; a corrected one is marked, not hidden
      exists(selectFrom("measurements as later").select("later.id").whereRef("later.supersedes_id", "=", "m.id")).as("superseded"),
    ])
    .where("w.bike_id", "=", bikeId)
    .where("w.shop_id", "=", shopId)
    .orderBy("m.device_time", "desc")
    .limit(500)
    .execute();
  const withdrawn = await withdrawnEntries(db, shopId, { bikeId });
  return { bike, workOrders, parts, measurements, withdrawn };
}

/** Every reading taken on a bike of the shop (corrected ones too), oldest first, for the readings CSV; null when the bike is not the shop's. */
export async function bikeReadings(
  db: Kysely<Database>,
  shopId: string,
  bikeId: string,
): Promise<{ tagCode: string; rows: ReadingCsvRow[] } | null> {
  const bike = await db.selectFrom("bikes").select("tag_code").where("id", "=", bikeId).where("shop_id", "=", shopId).executeTakeFirst();
  if (!bike) return null;
  const rows = await db
    .selectFrom("measurements as m")
    .innerJoin("work_orders as w", "w.id", "m.work_order_id")
    .innerJoin("measurement_specs as ms", "ms.id", "m.spec_id")
    .innerJoin("template_steps as st", "st.id", "m.step_id")
    .innerJoin("users as u", "u.id", "m.recorded_by")
    .select(({ exists, selectFrom }) => [
      "w.number",
      "st.title as stepTitle",
      "ms.label",
      "ms.reading_labels as readingLabels",
      "m.reading_index as readingIndex",
      "m.value",
      "m.unit",
      sql<string>`ms.min::text`.as("min"),
      sql<string>`ms.max::text`.as("max"),
      "m.verdict",
      "u.name as recordedBy",
      "m.device_time as at",
      exists(selectFrom("measurements as later").select("later.id").whereRef("later.supersedes_id", "=", "m.id")).as("superseded"),
      exists(selectFrom("current_measurements as c").select("c.id").whereRef("c.id", "=", "m.id")).as("current"),
    ])
    .where("w.bike_id", "=", bikeId)
    .where("w.shop_id", "=", shopId)
    .orderBy("m.device_time")
    .orderBy(sql`m.stamp COLLATE "C"`)
    .execute();
  return {
    tagCode: bike.tag_code,
    rows: rows.map((r) => ({
      workOrderNumber: r.number,
      stepTitle: r.stepTitle,
      reading: r.readingLabels.length ? `${r.label}, ${readingLabelOf(r.readingLabels, r.readingIndex)}` : r.label,
      value: r.value,
      unit: r.unit,
      min: r.min,
      max: r.max,
      verdict: r.verdict,
      standing: r.current ? "current" : r.superseded ? "corrected" : "earlier",
      recordedBy: r.recordedBy,
      recordedAt: r.at.toISOString(),
    })),
  };
}
