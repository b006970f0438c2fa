import type { Kysely } from "kysely";
import { bikeSchema, type BikeInput } from "@/lib/office/schemas";
import { Refusal } from "@/lib/office/refusal";
import { partColumns } from "../parts-fitted";
import type { Database } from "../schema";

// The next free tag in the shop's series (e.g. GSW-0006): the prefix of its existing tags, or
// three letters of the shop's slug for a shop with none yet.
export async function nextTagCode(db: Kysely<Database>, shopId: string): Promise<string> {
  const tags = await db.selectFrom("bikes").select("tag_code").where("shop_id", "=", shopId).execute();
  let prefix = "";
  let max = 0;
  for (const { tag_code } of tags) {
    const m = /^([A-Z]+)-(\d+)$/.exec(tag_code);
    if (!m) continue;
    prefix ||= m[1];
    if (m[1] === prefix) max = Math.max(max, Number(m[2]));
  }
  if (!prefix) {
    const shop = await db.selectFrom("shops").select("slug").where("id", "=", shopId).executeTakeFirstOrThrow();
    prefix = shop.slug.replace(/[^a-z]/gi, "").slice(0, 3).toUpperCase() || "TAG";
  }
  // Tags are unique across shops (a scanned tag finds one bike): step past any taken elsewhere.
  for (let n = max + 1; ; n++) {
    const tag = `${prefix}-${String(n).padStart(4, "0")}`;
    const taken = await db.selectFrom("bikes").select("id").where("tag_code", "=", tag).executeTakeFirst();
    if (!taken) return tag;
  }
}

export async function createBike(db: Kysely<Database>, shopId: string, input: BikeInput) {
  const b = bikeSchema.parse(input);
  const owner = await db.selectFrom("customers").select("id").where("id", "=", b.customerId).where("shop_id", "=", shopId).executeTakeFirst();
  if (!owner) throw new Refusal("Choose an owner from this shop's customers.", 422, [{ path: "customerId", message: "unknown customer" }]);
  const tag = b.tagCode || (await nextTagCode(db, shopId));
  const clash = await db.selectFrom("bikes").select("id").where("tag_code", "=", tag).executeTakeFirst();
  if (clash) throw new Refusal(`Tag ${tag} is already on another bike.`, 422, [{ path: "tagCode", message: `tag ${tag} is already in use` }]);
  return db
    .insertInto("bikes")
    .values({
      shop_id: shopId,
      customer_id: b.customerId,
      make: b.make,
      model: b.model,
      year: b.year,
      vin: b.vin,
      engine_number: b.engineNumber,
      displacement_cc: b.displacementCc,
      colour: b.colour,
      tag_code: tag,
      notes: b.notes,
    })
    .returning(["id", "tag_code as tagCode"])
    .executeTakeFirstOrThrow();
}

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

export async function bikesForLabels(db: Kysely<Database>, shopId: string, ids: string[] | null) {
  let q = db
    .selectFrom("bikes as b")
    .innerJoin("customers as c", "c.id", "b.customer_id")
    .select(["b.id", "b.make", "b.model", "b.year", "b.tag_code as tagCode", "c.name as customerName"])
    .where("b.shop_id", "=", shopId);
  if (ids) q = q.where("b.id", "in", ids.length ? ids : ["00000000-0000-0000-0000-000000000000"]);
  return q.orderBy("b.tag_code").execute();
}
