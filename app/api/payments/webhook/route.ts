import { handlePaymentWebhook } from "@/app/_server/payment-webhook";
import { MIB, publicRoute, reply, text } from "@/app/_server/route";
import { Refusal, type RefusalStatus } from "@/lib/errors";

// The payment service's webhook. No session and no Origin (the service is not a browser): the
// signature is the check (verifyPaymentWebhook in payment-webhook.ts), over the raw body.
export const POST = publicRoute({ check: "payment-signature", body: text(["application/json"], MIB) }, async ({ req, body, db }) => {
  const answer = await handlePaymentWebhook(db, body, req.headers.get("stripe-signature"));
  if (answer.status >= 400) throw new Refusal(answer.body.error ?? "Webhook refused.", answer.status as RefusalStatus);
  return reply(answer.body, { status: answer.status });
});
