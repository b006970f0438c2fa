import { getObject } from "@/app/_server/object-store";
import { idParam, route } from "@/app/_server/route";
import { findAttachment } from "@/db/office/attachments";
import { Refusal } from "@/lib/errors";

// A stored photo, read from object storage for a signed-in user of the same shop.
export const GET = route({ access: { area: "bike-records" }, params: ["id"] }, async ({ user, params, db }) => {
  const a = await findAttachment(db, user.shopId, idParam(params.id));
  if (!a) throw new Refusal("No such photo.", 404);
  const o = await getObject(a.objectKey);
  return new Response(Buffer.from(o.body), { headers: { "content-type": a.contentType, "cache-control": "private, max-age=3600" } });
});
