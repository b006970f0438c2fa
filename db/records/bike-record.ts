import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "../schema";
import { partColumns } from "./parts-fitted";

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
    .select([...partColumns, "w.number as workOrderNumber", "s.title as stepTitle"])
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
  return { bike, workOrders, parts, measurements };
}
