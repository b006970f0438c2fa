import "server-only";
import type Stripe from "stripe";
import { applyPaymentEvent } from "@/db/office/deposits";
import { appendAudit } from "@/db/audit/append";
import { mailBalanceReceived, mailDepositReceived } from "./customer-mail";
import { handToQueue } from "./mail";
import { verifyPaymentWebhook } from "./payments";
import type { Db } from "@/db/setup/client";

interface WebhookAnswer {
  status: number;
  body: { received?: boolean; outcome?: string; error?: string };
}

// The payment webhook, apart from Next so the integration tests drive it with a real database:
// verify the signature (refuse unsigned, wrongly signed and stale), apply the event once (a
// replayed event id changes nothing and is answered 2xx, so the provider stops sending it), mark
// the deposit paid and write to the customer.
export async function handlePaymentWebhook(
  db: Db,
  rawBody: string,
  signature: string | null,
  opts: { secret?: string; sendMail?: boolean } = {},
): Promise<WebhookAnswer> {
  let event: Stripe.Event;
  try {
    event = verifyPaymentWebhook(rawBody, signature, opts.secret);
  } catch (e) {
    const reason = (e as Error).message.split("\n")[0].slice(0, 200);
    await appendAudit(db, [
      { shopId: null, actorId: null, action: "payment.webhook", entity: "payment_event", outcome: "refused", reason },
    ]);
    return { status: 400, body: { error: `Webhook refused: ${reason}` } };
  }
  const obj = event.data?.object as Partial<Stripe.PaymentIntent> | undefined;
  const metadata = obj?.metadata ?? {};
  // a refund comes as the charge: its payment intent, and how much of it has gone back in all
  const charge = event.data?.object as Partial<Stripe.Charge> | undefined;
  const isCharge = charge?.object === "charge";
  const chargeIntent = isCharge && typeof charge.payment_intent === "string" ? charge.payment_intent : null;
  // The receipt is queued in the payment's own transaction (so a failure to queue it undoes the
  // payment's record, and the provider's retry does both), and handed to the queue after it commits.
  const receipts: string[] = [];
  const outcome = await applyPaymentEvent(
    db,
    {
      id: event.id,
      type: event.type,
      paymentIntentId: obj?.object === "payment_intent" ? (obj.id ?? null) : chargeIntent,
      amount: typeof obj?.amount === "number" ? obj.amount : null,
      currency: typeof obj?.currency === "string" ? obj.currency : null,
      named: { depositId: metadata.deposit_id ?? null, balancePaymentId: metadata.balance_payment_id ?? null },
      amountRefunded: isCharge && typeof charge.amount_refunded === "number" ? charge.amount_refunded : null,
    },
    async (trx, paid) => {
      if (opts.sendMail === false) return;
      const mail = paid.paymentFor === "deposit" ? mailDepositReceived : mailBalanceReceived;
      await mail(trx, paid.shopId, paid.workOrderId, paid.paymentId, paid.amountMinor, { storedInto: receipts });
    },
  );
  await handToQueue(receipts).catch((e) => console.error("[mail] queue not reached; the sweep will hand the receipt on", e));
  if (outcome.kind === "replayed") {
    await appendAudit(db, [
      {
        shopId: null,
        actorId: null,
        action: "payment.webhook",
        entity: "payment_event",
        entityId: event.id,
        outcome: "refused",
        reason: "event already processed",
      },
    ]);
    // a 2xx: the event was applied when it first came; a refusal would only make the provider send it again
    return { status: 200, body: { received: true, outcome: "already processed" } };
  }
  if (outcome.kind === "ignored") return { status: 200, body: { received: true, outcome: `ignored: ${outcome.reason}` } };
  if (outcome.kind === "failed") return { status: 200, body: { received: true, outcome: `${outcome.paymentFor} payment failed` } };
  if (outcome.kind === "refunded")
    return { status: 200, body: { received: true, outcome: `${outcome.paymentFor} ${outcome.whole ? "refunded" : "partly refunded"}` } };
  if (outcome.kind === "given-back")
    return {
      status: 200,
      body: { received: true, outcome: `${outcome.paymentFor} ${outcome.whole ? "given back" : "partly given back"}` },
    };
  // One receipt e-mail per payment: only the event that paid it sends one; a later, different
  // event about the same payment (a second succeeded event, a resend under a new id) does not.
  if (!outcome.newlyPaid) return { status: 200, body: { received: true, outcome: `${outcome.paymentFor} already paid` } };
  return { status: 200, body: { received: true, outcome: `${outcome.paymentFor} paid` } };
}
