import { idParam, json, route } from "@/app/_server/route";
import { assignMechanic } from "@/db/shop/work-orders";
import { assignSchema } from "@/lib/office/schemas";

export const POST = route({ access: { area: "office" }, params: ["id"], body: json(assignSchema) }, async ({ user, params, body, db }) => {
  await assignMechanic(db, user.shopId, user.id, idParam(params.id), body.mechanicId);
  return { ok: true };
});
