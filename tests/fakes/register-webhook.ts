// Registers an app's webhook URL with the payment service (the fake, or a real test account)
// through the SDK: `tsx --conditions=react-server tests/fakes/register-webhook.ts http://localhost:3200/api/payments/webhook`.
import { z } from "zod";
import { paymentsClient } from "@/app/_server/payments";

const url = z.url().parse(process.argv[2]);
const ep = await paymentsClient().webhookEndpoints.create({
  url,
  enabled_events: ["payment_intent.succeeded", "payment_intent.payment_failed"],
});
console.log(`[fakes] webhook endpoint ${ep.id} → ${ep.url}`);
