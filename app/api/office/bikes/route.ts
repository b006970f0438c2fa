import { containsPattern } from "@/db/shop/search";
import { NextResponse } from "next/server";
import { guarded, readJson } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { createBike } from "@/db/shop/bikes";
import { bikeSchema } from "@/lib/office/schemas";

// GET: bikes to choose from (search by tag, make, model or owner). POST: add a bike.
export const GET = guarded("office", async ({ req, user }) => {
  const q = (new URL(req.url).searchParams.get("q") ?? "").trim().slice(0, 60);
  let query = db()
    .selectFrom("bikes as b")
    .innerJoin("customers as c", "c.id", "b.customer_id")
    .select(["b.id", "b.make", "b.model", "b.year", "b.tag_code as tagCode", "c.name as customerName"])
    .where("b.shop_id", "=", user.shopId);
  if (q) {
    const like = containsPattern(q);
    query = query.where((eb) => eb.or([eb("b.tag_code", "ilike", like), eb("b.make", "ilike", like), eb("b.model", "ilike", like), eb("c.name", "ilike", like)]));
  }
  return NextResponse.json({ bikes: await query.orderBy("b.tag_code").limit(50).execute() });
});

export const POST = guarded("office", async ({ req, user }) => {
  const body = await readJson(req, bikeSchema);
  return NextResponse.json(await createBike(db(), user.shopId, body), { status: 201 });
});
