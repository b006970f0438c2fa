import { NextResponse } from "next/server";
import { startDepositPayment } from "@/app/_server/payments";
import { guarded, idFrom } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { attachPaymentIntent, openDeposit } from "@/db/office/deposits";
import { Refusal } from "@/lib/office/refusal";

// The customer pays the deposit of their approved quote. The payment service confirms by a signed
// webhook; until then the deposit shows as pending.
export const POST = guarded<{ id: string }>("my-bikes", async ({ user, params }) => {
  const { deposit, workOrderNumber } = await openDeposit(db(), user, idFrom(params.id));
  let intent;
  try {
    intent = await startDepositPayment({ depositId: deposit.id, amountMinor: deposit.amount_minor, currency: deposit.currency, shopId: user.shopId, workOrderId: deposit.work_order_id, description: `Deposit, work order ${workOrderNumber}` });
  } catch (e) {
    throw new Refusal(`The payment service did not take the payment: ${(e as Error).message}`, 409);
  }
  await attachPaymentIntent(db(), deposit.id, intent.id);
  return NextResponse.json({ depositId: deposit.id, paymentStatus: intent.status });
});
