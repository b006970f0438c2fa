import { startDepositPayment } from "@/app/_server/payments";
import { idParam, route } from "@/app/_server/route";
import { attachPaymentIntent, openDeposit } from "@/db/office/deposits";

// The customer pays the deposit of their approved quote. The payment service confirms by a signed
// webhook; until then the deposit shows as pending.
export const POST = route({ access: { area: "my-bikes" }, params: ["id"] }, async ({ user, params, db }) => {
  const { deposit, workOrderNumber } = await openDeposit(db, user, idParam(params.id));
  const intent = await startDepositPayment({
    depositId: deposit.id,
    amountMinor: deposit.amount_minor,
    currency: deposit.currency,
    shopId: user.shopId,
    workOrderId: deposit.work_order_id,
    description: `Deposit, work order ${workOrderNumber}`,
  });
  await attachPaymentIntent(db, deposit.id, intent.id);
  return { depositId: deposit.id, paymentStatus: intent.status };
});
