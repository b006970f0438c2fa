import { getObject } from "@/app/_server/object-store";
import { idParam, route } from "@/app/_server/route";
import { extraWorkPhotoForCustomer } from "@/db/office/supplements";
import { Refusal } from "@/lib/errors";

// A photo the office showed with extra work, for the customer whose bike it is (anyone else: 404).
export const GET = route({ access: { area: "my-bikes" }, params: ["id"] }, async ({ user, params, db }) => {
  const a = await extraWorkPhotoForCustomer(db, user, idParam(params.id));
  if (!a) throw new Refusal("No such photo.", 404);
  const o = await getObject(a.objectKey);
  return new Response(Buffer.from(o.body), { headers: { "content-type": a.contentType, "cache-control": "private, max-age=3600" } });
});
