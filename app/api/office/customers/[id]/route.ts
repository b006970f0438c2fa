import { idParam, json, route } from "@/app/_server/route";
import { getCustomer, updateCustomer } from "@/db/shop/customers";
import { Refusal } from "@/lib/errors";
import { customerSchema } from "@/lib/office/schemas";

export const GET = route({ access: { area: "office" }, params: ["id"] }, async ({ user, params, db }) => {
  const c = await getCustomer(db, user.shopId, idParam(params.id));
  if (!c) throw new Refusal("No such customer in this shop.", 404);
  return { customer: c };
});

export const PUT = route({ access: { area: "office" }, params: ["id"], body: json(customerSchema) }, async ({ user, params, body, db }) => {
  await updateCustomer(db, user.shopId, idParam(params.id), body);
  return { ok: true };
});
