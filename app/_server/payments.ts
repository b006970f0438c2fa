import "server-only";
import Stripe from "stripe";
import { Refusal } from "@/lib/errors";
import { officeConfig } from "./office-config";

// The payment provider through the Stripe SDK, pointed by STRIPE_API_BASE at the real API or at
// the local fake (tests/fakes/fake-payments.ts).
export function paymentsClient(): Stripe {
  const cfg = officeConfig();
  const base = new URL(cfg.STRIPE_API_BASE);
  return new Stripe(cfg.STRIPE_SECRET_KEY, {
    host: base.hostname,
    port: base.port || (base.protocol === "https:" ? 443 : 80),
    protocol: base.protocol === "https:" ? "https" : "http",
    maxNetworkRetries: 1,
    timeout: 10_000,
    telemetry: false,
  });
}

interface PaymentStart {
  amountMinor: number;
  currency: string;
  shopId: string;
  workOrderId: string;
  description: string;
}

// Creates the PaymentIntent for a deposit (idempotent per deposit) and, in test mode, confirms it
// with the configured test payment method; the provider then reports success by webhook.
export async function startDepositPayment(d: PaymentStart & { depositId: string }) {
  return startPayment(d, `deposit-${d.depositId}`, { deposit_id: d.depositId });
}

/** The same for the balance of a bill (idempotent per balance payment row). */
export async function startBalancePayment(d: PaymentStart & { balancePaymentId: string; invoiceId: string }) {
  return startPayment(d, `balance-${d.balancePaymentId}`, { balance_payment_id: d.balancePaymentId, invoice_id: d.invoiceId });
}

/**
 * Starts the payment; the provider's failure is refused (409) in one place for deposits and
 * balances. A declined card is said as the provider words it for the payer; anything else (a key,
 * a connection, an id the provider does not know) is the workshop's to fix: logged, and the
 * customer is told plainly that nothing was charged.
 */
async function startPayment(d: PaymentStart, key: string, metadata: Record<string, string>) {
  try {
    return await createIntent(d, key, metadata);
  } catch (e) {
    if (e instanceof Stripe.errors.StripeCardError) throw new Refusal(`The card was not accepted: ${e.message}`, 409);
    console.error("[payments] the payment service refused to start a payment", e);
    throw new Refusal(
      "The payment service could not take the payment just now, and nothing was charged. Try again later, or ask the workshop.",
      409,
    );
  }
}

async function createIntent(d: PaymentStart, key: string, metadata: Record<string, string>) {
  const cfg = officeConfig();
  const stripe = paymentsClient();
  const intent = await stripe.paymentIntents.create(
    {
      amount: d.amountMinor,
      currency: d.currency.toLowerCase(),
      description: d.description,
      metadata: { ...metadata, shop_id: d.shopId, work_order_id: d.workOrderId },
    },
    { idempotencyKey: key },
  );
  if (intent.status !== "succeeded" && intent.status !== "processing" && cfg.STRIPE_TEST_PAYMENT_METHOD) {
    const confirmed = await stripe.paymentIntents.confirm(
      intent.id,
      { payment_method: cfg.STRIPE_TEST_PAYMENT_METHOD },
      { idempotencyKey: `${key}-confirm` },
    );
    return { id: confirmed.id, status: confirmed.status };
  }
  return { id: intent.id, status: intent.status };
}

/** How far a webhook's signature time may be from the server clock, either way. */
export const WEBHOOK_TOLERANCE_S = 300;

// Verifies a webhook's signature (Stripe's scheme: HMAC-SHA256 over "timestamp.body") and returns
// the event; throws when unsigned, wrongly signed, or dated more than the tolerance before or
// after the server clock. The SDK checks only the past; a signature dated in the future (a
// captured one re-sent later would be, if the sender's clock ran ahead) is refused here.
export function verifyPaymentWebhook(
  rawBody: string,
  signature: string | null,
  secret = officeConfig().STRIPE_WEBHOOK_SECRET,
  toleranceS = WEBHOOK_TOLERANCE_S,
  nowS = Math.floor(Date.now() / 1000),
): Stripe.Event {
  if (!signature) throw new Error("missing Stripe-Signature header");
  const event = Stripe.webhooks.constructEvent(rawBody, signature, secret, toleranceS);
  const signedAt = signatureTime(signature);
  if (signedAt === null) throw new Error("the Stripe-Signature header carries no time");
  if (signedAt > nowS + toleranceS) throw new Error(`signature dated ${signedAt - nowS} s in the future (tolerance ${toleranceS} s)`);
  return event;
}

/** The `t=` of a Stripe-Signature header (seconds since 1970), or null. */
export function signatureTime(header: string): number | null {
  const t = header
    .split(",")
    .map((part) => part.trim().split("="))
    .find(([k]) => k === "t")?.[1];
  return t && /^\d{1,12}$/.test(t) ? Number(t) : null;
}

/**
 * Asks the provider to give back `amountMinor` of a payment. The key makes it once only: the same
 * key (the give-back and how much has gone back so far) asks nothing twice, however often the
 * office presses. The provider reports the refund by webhook (charge.refunded). Its refusal, or no
 * answer, is said in workshop words; nothing is recorded as given back until the provider says so.
 */
export async function askRefund(
  paymentIntentId: string,
  amountMinor: number,
  idempotencyKey: string,
): Promise<{ id: string; status: string | null }> {
  try {
    const refund = await paymentsClient().refunds.create({ payment_intent: paymentIntentId, amount: amountMinor }, { idempotencyKey });
    return { id: refund.id, status: refund.status };
  } catch (e) {
    console.error("[payments] the payment service refused a refund", e);
    // a plain refusal (nothing to refund, already refunded, too much): the provider's own words
    if (e instanceof Stripe.errors.StripeInvalidRequestError) {
      throw new Refusal(
        `The payment service did not give the money back. It said: ${e.message} If it says the payment is refunded already, the line goes when its report arrives.`,
        409,
      );
    }
    // no clear answer (no connection, a time-out, the same request still running): the refund may have been made
    throw new Refusal(
      "The payment service gave no clear answer, so the money may or may not have gone back. The line goes when the provider reports a refund; check the provider's dashboard before asking again.",
      409,
    );
  }
}
