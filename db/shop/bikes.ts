import "server-only";
import type { Kysely } from "kysely";
import { bikeSchema, type BikeInput } from "@/lib/office/schemas";
import { Refusal } from "@/lib/errors";
import type { Database } from "../schema";
import { withKeysHeld } from "../setup/key-locks";
import { containsPattern } from "./search";

// The next free tag in the shop's series (e.g. GSW-0006): the prefix of its existing tags, or
// three letters of the shop's slug for a shop with none yet.
async function nextTagCode(db: Kysely<Database>, shopId: string): Promise<string> {
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
    prefix =
      shop.slug
        .replace(/[^a-z]/gi, "")
        .slice(0, 3)
        .toUpperCase() || "TAG";
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
  const owner = await db
    .selectFrom("customers")
    .select("id")
    .where("id", "=", b.customerId)
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
  if (!owner) throw new Refusal("Choose an owner from this shop's customers.", 422, [{ path: "customerId", message: "unknown customer" }]);
  // The shop's next free tag is given, and a chosen tag checked, one request at a time (two offices
  // registering bikes at once): the second gets the tag after, or is refused in words, never by the
  // unique index.
  return withKeysHeld(db, [`bike-tags:${shopId}`, ...(b.tagCode ? [`bike-tag:${b.tagCode}`] : [])], async (trx) => {
    const tag = b.tagCode || (await nextTagCode(trx, shopId));
    const clash = await trx.selectFrom("bikes").select("id").where("tag_code", "=", tag).executeTakeFirst();
    if (clash)
      throw new Refusal(`Tag ${tag} is already on another bike.`, 422, [{ path: "tagCode", message: `tag ${tag} is already in use` }]);
    return trx
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
  });
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

// A customer's own bikes with their work orders (for the customer's own view).
export async function bikesOfCustomer(db: Kysely<Database>, shopId: string, customerId: string) {
  const bikes = await db
    .selectFrom("bikes")
    .select(["id", "make", "model", "year", "colour", "tag_code as tagCode"])
    .where("shop_id", "=", shopId)
    .where("customer_id", "=", customerId)
    .orderBy("make")
    .execute();
  const orders = bikes.length
    ? await db
        .selectFrom("work_orders")
        .select(["id", "bike_id as bikeId", "number", "title", "status", "updated_at as updatedAt"])
        .where("shop_id", "=", shopId)
        .where(
          "bike_id",
          "in",
          bikes.map((b) => b.id),
        )
        .orderBy("number", "desc")
        .execute()
    : [];
  return bikes.map((b) => ({ ...b, workOrders: orders.filter((o) => o.bikeId === b.id) }));
}

/** Bikes to choose from (at most 50), searched by tag, make, model or owner. */
export async function searchBikes(db: Kysely<Database>, shopId: string, search: string) {
  const q = search.trim().slice(0, 60);
  let query = db
    .selectFrom("bikes as b")
    .innerJoin("customers as c", "c.id", "b.customer_id")
    .select(["b.id", "b.make", "b.model", "b.year", "b.tag_code as tagCode", "c.name as customerName"])
    .where("b.shop_id", "=", shopId);
  if (q) {
    const like = containsPattern(q);
    query = query.where((eb) =>
      eb.or([eb("b.tag_code", "ilike", like), eb("b.make", "ilike", like), eb("b.model", "ilike", like), eb("c.name", "ilike", like)]),
    );
  }
  return query.orderBy("b.tag_code").limit(50).execute();
}
