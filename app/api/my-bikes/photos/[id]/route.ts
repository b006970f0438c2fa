import { getObject } from "@/app/_server/object-store";
import { idParam, route } from "@/app/_server/route";
import { photoSharedWithCustomer } from "@/db/customer-contact/progress-updates";
import { Refusal } from "@/lib/errors";

// A photo the office shared in a progress update on one of the signed-in customer's own bikes.
// Any other photo — another customer's, one never shared — is "not found" (the same answer, so
// nobody learns which photos exist).
export const GET = route({ access: { area: "my-bikes" }, params: ["id"] }, async ({ user, params, db }) => {
  const photo = user.customerId
    ? await photoSharedWithCustomer(db, user.shopId, user.customerId, idParam(params.id, "No such photo."))
    : null;
  if (!photo) throw new Refusal("No such photo.", 404);
  const o = await getObject(photo.objectKey);
  return new Response(Buffer.from(o.body), { headers: { "content-type": photo.contentType, "cache-control": "private, max-age=3600" } });
});
