import { idParam, route } from "@/app/_server/route";
import { balancePaymentForCustomer } from "@/db/office/balance-payments";
import { Refusal } from "@/lib/errors";

export const GET = route({ access: { area: "my-bikes" }, params: ["id"] }, async ({ user, params, db }) => {
  const p = await balancePaymentForCustomer(db, user, idParam(params.id));
  if (!p) throw new Refusal("No such payment.", 404);
  return { payment: { ...p, amountMinor: Number(p.amountMinor) } };
});
