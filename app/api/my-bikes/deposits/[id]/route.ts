import { idParam, route } from "@/app/_server/route";
import { depositForCustomer } from "@/db/office/deposits";
import { Refusal } from "@/lib/errors";

export const GET = route({ access: { area: "my-bikes" }, params: ["id"] }, async ({ user, params, db }) => {
  const d = await depositForCustomer(db, user, idParam(params.id));
  if (!d) throw new Refusal("No such deposit.", 404);
  return { deposit: d };
});
