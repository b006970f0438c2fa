import { getObject } from "@/app/_server/object-store";
import { guarded, idFrom } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { Refusal } from "@/lib/office/refusal";

// A stored photo, read from object storage for a signed-in user of the same shop.
export const GET = guarded<{ id: string }>("bike-records", async ({ user, params }) => {
  const a = await db().selectFrom("attachments").select(["object_key", "content_type"]).where("id", "=", idFrom(params.id)).where("shop_id", "=", user.shopId).executeTakeFirst();
  if (!a) throw new Refusal("No such photo.", 404);
  const o = await getObject(a.object_key);
  return new Response(Buffer.from(o.body), { headers: { "content-type": a.content_type, "cache-control": "private, max-age=3600" } });
});
