import { startBalancePayment } from "@/app/_server/payments";
import { idParam, route } from "@/app/_server/route";
import { attachBalanceIntent, openBalancePayment } from "@/db/office/balance-payments";

// The customer pays the balance of their issued bill. The payment service confirms by a signed webhook.
export const POST = route({ access: { area: "my-bikes" }, params: ["id"] }, async ({ user, params, db }) => {
  const { payment, invoiceNumber } = await openBalancePayment(db, user, idParam(params.id));
  const intent = await startBalancePayment({
    balancePaymentId: payment.id,
    invoiceId: payment.invoice_id,
    amountMinor: payment.amount_minor,
    currency: payment.currency,
    shopId: user.shopId,
    workOrderId: payment.work_order_id,
    description: `Balance, bill ${invoiceNumber}`,
  });
  await attachBalanceIntent(db, payment.id, intent.id);
  return { balancePaymentId: payment.id, paymentStatus: intent.status };
});
