import { openGiveBacks } from "@/db/office/give-backs";
import Stripe from "stripe";
import { beforeAll, describe, expect, it } from "vitest";
import { handlePaymentWebhook } from "@/app/_server/payment-webhook";
import { attachBalanceIntent, openBalancePayment } from "@/db/office/balance-payments";
import { issueBill } from "@/db/office/final-bill";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { insertQuotedJob } from "./support/quoted-job";
import { useTestDb } from "./support/test-db";

// The balance of an issued bill, paid through the payment service: the signed webhook marks it
// paid once; a replayed event, an unsigned one and one for another amount change nothing.

const db = useTestDb();
const SECRET = "whsec_benchtag_local";
let fx: ShopFixture;
let number = 9000;
beforeAll(async () => {
  fx = await createShopFixture(db);
});

async function billedJob() {
  const n = ++number;
  const { workOrderId, quoteId } = await insertQuotedJob(db, fx, { number: n, title: `Balance ${n}`, status: "ready" });
  const wo = { id: workOrderId };
  const q = { id: quoteId };
  await db
    .insertInto("quote_lines")
    .values({
      quote_id: q.id,
      position: 0,
      kind: "labour",
      description: "Rebuild",
      part_number: null,
      quantity_hundredths: 1000,
      unit_price_minor: 7000,
      line_total_minor: 70000,
    })
    .execute();
  const bill = await issueBill(db, fx.shopId, fx.users.office.id, wo.id, {});
  return { jobId: wo.id, bill };
}
const event = (pi: string, amount: number, id = `evt_bal_${Math.random().toString(36).slice(2)}`) =>
  JSON.stringify({
    id,
    object: "event",
    type: "payment_intent.succeeded",
    created: Math.floor(Date.now() / 1000),
    data: { object: { id: pi, object: "payment_intent", amount, currency: "gbp", status: "succeeded" } },
  });
const sign = (payload: string) => Stripe.webhooks.generateTestHeaderString({ payload, secret: SECRET });
const statusOf = async (id: string) =>
  (await db.selectFrom("balance_payments").select("status").where("id", "=", id).executeTakeFirstOrThrow()).status;

describe("the balance of a bill through the signed webhook", () => {
  it("is paid once by a signed event of the right amount; unsigned, wrong-amount and replayed events change nothing", async () => {
    const { bill } = await billedJob();
    // 10.00 h × 70.00 = 700.00; tax 20 % = 140.00; no deposit
    expect(Number(bill.balance_due_minor)).toBe(84000);
    const customer = { shopId: fx.shopId, customerId: fx.customerId };
    const { payment } = await openBalancePayment(db, customer, bill.id);
    expect(payment.amount_minor).toBe(84000);
    const pi = `pi_bal_${Date.now()}`;
    await attachBalanceIntent(db, payment.id, pi);

    const unsigned = await handlePaymentWebhook(db, event(pi, 84000), null, { secret: SECRET, sendMail: false });
    expect(unsigned.status).toBe(400);
    const wrong = event(pi, 100);
    expect((await handlePaymentWebhook(db, wrong, sign(wrong), { secret: SECRET, sendMail: false })).body.outcome).toBe(
      "ignored: amount or currency does not match the balance",
    );
    expect(await statusOf(payment.id)).toBe("pending");

    const good = event(pi, 84000);
    expect(await handlePaymentWebhook(db, good, sign(good), { secret: SECRET, sendMail: false })).toEqual({
      status: 200,
      body: { received: true, outcome: "balance paid" },
    });
    expect(await statusOf(payment.id)).toBe("paid");
    // the same event again is answered 2xx (so the provider stops sending it) and changes nothing
    expect(await handlePaymentWebhook(db, good, sign(good), { secret: SECRET, sendMail: false })).toEqual({
      status: 200,
      body: { received: true, outcome: "already processed" },
    });
    expect(await statusOf(payment.id)).toBe("paid");
    await expect(openBalancePayment(db, customer, bill.id)).rejects.toThrow("The balance is already paid.");
  });

  it("a card that failed and then succeeds after the balance was paid another way is answered, not retried for ever, and flagged to give back", async () => {
    const { bill } = await billedJob();
    const customer = { shopId: fx.shopId, customerId: fx.customerId };
    const first = (await openBalancePayment(db, customer, bill.id)).payment;
    const pi1 = `pi_bal_first_${Date.now()}`;
    await attachBalanceIntent(db, first.id, pi1);
    const failed = JSON.stringify({
      id: `evt_bal_${Math.random().toString(36).slice(2)}`,
      object: "event",
      type: "payment_intent.payment_failed",
      created: Math.floor(Date.now() / 1000),
      data: { object: { id: pi1, object: "payment_intent", amount: 84000, currency: "gbp", status: "requires_payment_method" } },
    });
    await handlePaymentWebhook(db, failed, sign(failed), { secret: SECRET, sendMail: false });
    expect(await statusOf(first.id)).toBe("failed");
    // the customer pays again with another card: paid
    const second = (await openBalancePayment(db, customer, bill.id)).payment;
    const pi2 = `pi_bal_second_${Date.now()}`;
    await attachBalanceIntent(db, second.id, pi2);
    const ok = event(pi2, 84000);
    expect((await handlePaymentWebhook(db, ok, sign(ok), { secret: SECRET, sendMail: false })).body.outcome).toBe("balance paid");
    // then the first card's payment goes through after all: the bill is paid already
    const late = event(pi1, 84000);
    const answer = await handlePaymentWebhook(db, late, sign(late), { secret: SECRET, sendMail: false });
    expect(answer).toEqual({ status: 200, body: { received: true, outcome: "ignored: the bill is paid already by another payment" } });
    expect([await statusOf(first.id), await statusOf(second.id)]).toEqual(["failed", "paid"]);
    const audit = await db
      .selectFrom("audit_log")
      .select(["outcome", "reason"])
      .where("entity_id", "=", first.id)
      .where("action", "=", "balance.paid")
      .executeTakeFirstOrThrow();
    expect(audit).toEqual({ outcome: "refused", reason: "taken after the bill was paid by another payment: to be given back" });
    expect((await openGiveBacks(db, fx.shopId)).filter((g) => g.paymentIntentId === pi1)).toEqual([
      expect.objectContaining({ paymentFor: "balance", amountMinor: 84000, reason: "Taken after the bill was paid by another payment." }),
    ]);
  });

  it("is not the business of another customer", async () => {
    const { bill } = await billedJob();
    const other = await createShopFixture(db);
    await expect(openBalancePayment(db, { shopId: other.shopId, customerId: other.customerId }, bill.id)).rejects.toThrow(
      "This bill is not yours.",
    );
  });
});
