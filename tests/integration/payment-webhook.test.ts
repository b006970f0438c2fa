import http from "node:http";
import type { Kysely } from "kysely";
import type { AddressInfo } from "node:net";
import Stripe from "stripe";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { handlePaymentWebhook } from "@/app/_server/payment-webhook";
import { paymentsClient, startDepositPayment } from "@/app/_server/payments";
import { createBike } from "@/db/shop/bikes";
import { applyPaymentEvent, attachPaymentIntent, openDeposit } from "@/db/office/deposits";
import { openGiveBacks } from "@/db/office/give-backs";
import { backfillGiveBacks } from "@/db/migrations/2026_12_11_210_money_to_give_back";
import { approveQuoteAsCustomer, saveQuoteDraft, sendQuote } from "@/db/office/quotes";
import { bookIn, moveWorkOrder } from "@/db/shop/work-orders";
import { createShopFixture } from "./support/shop-fixture";
import { mailTo, useFakes } from "./support/fakes";
import { eventually, useQueueWorkers } from "./support/queue";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
useQueueWorkers(db);
const SECRET = "whsec_benchtag_local";
let ports: ReturnType<typeof useFakes>;
beforeAll(() => {
  ports = useFakes();
});

// A job with an approved quote and a pending deposit of 5000 (GBP pence) tied to payment intent `pi`.
async function workOrderWithPendingDeposit(pi: string) {
  const fx = await createShopFixture(db, { status: "handed_over" });
  await db.updateTable("shops").set({ currency: "GBP" }).where("id", "=", fx.shopId).execute();
  const bike = await createBike(db, fx.shopId, { customerId: fx.customerId, make: "Corvid", model: "RX1000" });
  const wo = await bookIn(db, fx.shopId, fx.users.office.id, { bikeId: bike.id, title: "Rebuild", complaint: "Smoke", odometerKm: 10 });
  await moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "inspected");
  await saveQuoteDraft(db, fx.shopId, fx.users.office.id, wo.id, {
    lines: [{ kind: "labour", description: "Rebuild", quantityHundredths: 1000, unitPriceMinor: 7000 }],
    depositMinor: 5000,
  });
  const { quoteId } = await sendQuote(db, fx.shopId, fx.users.office.id, wo.id);
  const cust = { id: fx.users.customer.id, shopId: fx.shopId, customerId: fx.customerId };
  await approveQuoteAsCustomer(db, cust, quoteId);
  const { deposit } = await openDeposit(db, cust, quoteId);
  if (pi) await attachPaymentIntent(db, deposit.id, pi);
  return { fx, wo, deposit, quoteId, cust };
}

function succeededEvent(
  pi: string,
  amount = 5000,
  id = `evt_test_${Math.random().toString(36).slice(2)}`,
  metadata: Record<string, string> = {},
) {
  return JSON.stringify({
    id,
    object: "event",
    type: "payment_intent.succeeded",
    created: Math.floor(Date.now() / 1000),
    data: { object: { id: pi, object: "payment_intent", amount, currency: "gbp", status: "succeeded", metadata } },
  });
}
const sign = (payload: string, secret = SECRET, timestamp?: number) =>
  Stripe.webhooks.generateTestHeaderString({ payload, secret, timestamp });
const depositStatus = async (id: string) =>
  (await db.selectFrom("deposits").select("status").where("id", "=", id).executeTakeFirstOrThrow()).status;

describe("payment webhook signature checks", () => {
  it("accepts a correctly signed event and marks the deposit paid", async () => {
    const pi = `pi_test_${Date.now()}a`;
    const { deposit } = await workOrderWithPendingDeposit(pi);
    const body = succeededEvent(pi);
    const answer = await handlePaymentWebhook(db, body, sign(body), { secret: SECRET, sendMail: false });
    expect(answer).toEqual({ status: 200, body: { received: true, outcome: "deposit paid" } });
    expect(await depositStatus(deposit.id)).toBe("paid");
  });

  it("refuses an unsigned event", async () => {
    const pi = `pi_test_${Date.now()}b`;
    const { deposit } = await workOrderWithPendingDeposit(pi);
    const answer = await handlePaymentWebhook(db, succeededEvent(pi), null, { secret: SECRET, sendMail: false });
    expect(answer.status).toBe(400);
    expect(answer.body.error).toMatch(/missing Stripe-Signature/);
    expect(await depositStatus(deposit.id)).toBe("pending");
  });

  it("refuses an event signed with another secret, and one whose body was altered after signing", async () => {
    const pi = `pi_test_${Date.now()}c`;
    const { deposit } = await workOrderWithPendingDeposit(pi);
    const body = succeededEvent(pi);
    const wrong = await handlePaymentWebhook(db, body, sign(body, "whsec_someone_else"), { secret: SECRET, sendMail: false });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error).toMatch(/signature/i);
    const altered = await handlePaymentWebhook(db, body.replace('"amount":5000', '"amount":1'), sign(body), {
      secret: SECRET,
      sendMail: false,
    });
    expect(altered.status).toBe(400);
    expect(await depositStatus(deposit.id)).toBe("pending");
  });

  it("refuses a stale event (signed more than five minutes ago)", async () => {
    const pi = `pi_test_${Date.now()}d`;
    const { deposit } = await workOrderWithPendingDeposit(pi);
    const body = succeededEvent(pi);
    const answer = await handlePaymentWebhook(db, body, sign(body, SECRET, Math.floor(Date.now() / 1000) - 600), {
      secret: SECRET,
      sendMail: false,
    });
    expect(answer.status).toBe(400);
    expect(answer.body.error).toMatch(/tolerance/i);
    expect(await depositStatus(deposit.id)).toBe("pending");
  });

  it("refuses an event signed more than five minutes in the future, and takes one inside the window either way", async () => {
    const pi = `pi_test_${Date.now()}g`;
    const { deposit } = await workOrderWithPendingDeposit(pi);
    const body = succeededEvent(pi);
    const now = Math.floor(Date.now() / 1000);
    for (const ahead of [24 * 3600, 301]) {
      const answer = await handlePaymentWebhook(db, body, sign(body, SECRET, now + ahead), { secret: SECRET, sendMail: false });
      expect(answer.status).toBe(400);
      expect(answer.body.error).toMatch(/in the future \(tolerance 300 s\)/);
    }
    expect(await depositStatus(deposit.id)).toBe("pending");
    const within = await handlePaymentWebhook(db, body, sign(body, SECRET, now + 60), { secret: SECRET, sendMail: false });
    expect(within.status).toBe(200);
    expect(await depositStatus(deposit.id)).toBe("paid");
  });

  it("sends one deposit e-mail per deposit, whatever further events arrive about it", async () => {
    const pi = `pi_test_${Date.now()}h`;
    const { deposit, wo } = await workOrderWithPendingDeposit(pi);
    const sent = () =>
      db
        .selectFrom("outbound_emails")
        .select("id")
        .where("work_order_id", "=", wo.id)
        .where("kind", "=", "deposit_received")
        .execute()
        .then((r) => r.length);
    // two different events (new ids) about the same payment, one after the other and then two at once
    const first = succeededEvent(pi);
    expect((await handlePaymentWebhook(db, first, sign(first), { secret: SECRET })).body.outcome).toBe("deposit paid");
    const second = succeededEvent(pi);
    expect((await handlePaymentWebhook(db, second, sign(second), { secret: SECRET })).body.outcome).toBe("deposit already paid");
    const [x, y] = [succeededEvent(pi), succeededEvent(pi)];
    await Promise.all([handlePaymentWebhook(db, x, sign(x), { secret: SECRET }), handlePaymentWebhook(db, y, sign(y), { secret: SECRET })]);
    expect(await depositStatus(deposit.id)).toBe("paid");
    const queued = await db
      .selectFrom("mail_outbox")
      .select("id")
      .where("work_order_id", "=", wo.id)
      .where("kind", "=", "deposit_received")
      .execute();
    expect(queued).toHaveLength(1);
    await eventually(async () => (await sent()) >= 1);
    await new Promise((r) => setTimeout(r, 1000));
    expect(await sent()).toBe(1);
  });

  it("answers a replayed event id with a 2xx (so the provider stops sending it), even re-signed, and changes nothing more", async () => {
    const pi = `pi_test_${Date.now()}e`;
    const { deposit } = await workOrderWithPendingDeposit(pi);
    const body = succeededEvent(pi, 5000, `evt_replay_${Date.now()}`);
    expect((await handlePaymentWebhook(db, body, sign(body), { secret: SECRET, sendMail: false })).status).toBe(200);
    const paidAt = (await db.selectFrom("deposits").select("paid_at").where("id", "=", deposit.id).executeTakeFirstOrThrow()).paid_at;
    const again = await handlePaymentWebhook(db, body, sign(body), { secret: SECRET, sendMail: false });
    expect(again).toEqual({ status: 200, body: { received: true, outcome: "already processed" } });
    const after = (await db.selectFrom("deposits").select("paid_at").where("id", "=", deposit.id).executeTakeFirstOrThrow()).paid_at;
    expect(after).toEqual(paidAt);
  });

  it("a payment reported before its intent is tied to the deposit is recorded on the deposit its metadata names", async () => {
    // the provider reports the payment the moment it is confirmed, which can be before the route that
    // started it has written the intent's id on the deposit: that report is the only one it sends
    const pi = `pi_test_${Date.now()}early`;
    const { deposit } = await workOrderWithPendingDeposit("");
    const body = succeededEvent(pi, 5000, undefined, { deposit_id: deposit.id });
    const answer = await handlePaymentWebhook(db, body, sign(body), { secret: SECRET, sendMail: false });
    expect(answer).toEqual({ status: 200, body: { received: true, outcome: "deposit paid" } });
    const row = await db
      .selectFrom("deposits")
      .select(["status", "payment_intent_id"])
      .where("id", "=", deposit.id)
      .executeTakeFirstOrThrow();
    expect(row).toEqual({ status: "paid", payment_intent_id: pi });
    // the route's own tie, coming after, changes nothing
    await attachPaymentIntent(db, deposit.id, pi);
    expect(await depositStatus(deposit.id)).toBe("paid");

    // metadata naming a deposit already tied to another payment is not taken at its word
    const other = `pi_test_${Date.now()}other`;
    const stray = succeededEvent(other, 5000, undefined, { deposit_id: deposit.id });
    const strayAnswer = await handlePaymentWebhook(db, stray, sign(stray), { secret: SECRET, sendMail: false });
    expect(strayAnswer.body.outcome).toMatch(/^ignored: no deposit or balance payment for this payment/);
    expect(
      (await db.selectFrom("deposits").select("payment_intent_id").where("id", "=", deposit.id).executeTakeFirstOrThrow())
        .payment_intent_id,
    ).toBe(pi);
  });

  it("the receipt is queued in the payment's own transaction: when queueing fails, nothing is kept and the provider's retry does both", async () => {
    const pi = `pi_test_${Date.now()}tx`;
    const { deposit } = await workOrderWithPendingDeposit(pi);
    const event = { id: `evt_tx_${Date.now()}`, type: "payment_intent.succeeded", paymentIntentId: pi, amount: 5000, currency: "gbp" };
    await expect(
      applyPaymentEvent(db, event, async () => {
        throw new Error("outbox unreachable");
      }),
    ).rejects.toThrow(/outbox unreachable/);
    expect(await depositStatus(deposit.id)).toBe("pending");
    expect(await db.selectFrom("payment_events").select("event_id").where("event_id", "=", event.id).execute()).toEqual([]);
    let receipts = 0;
    const retry = await applyPaymentEvent(db, event, async () => {
      receipts++;
    });
    expect(retry).toMatchObject({ kind: "paid", newlyPaid: true });
    expect(receipts).toBe(1);
    expect(await depositStatus(deposit.id)).toBe("paid");
  });

  it("does not mark a deposit paid when the amount differs", async () => {
    const pi = `pi_test_${Date.now()}f`;
    const { deposit } = await workOrderWithPendingDeposit(pi);
    const body = succeededEvent(pi, 4999);
    const answer = await handlePaymentWebhook(db, body, sign(body), { secret: SECRET, sendMail: false });
    expect(answer.body.outcome).toMatch(/amount or currency does not match/);
    expect(await depositStatus(deposit.id)).toBe("pending");
  });
});

describe("deposit through the SDK against the local fake payment service", () => {
  let server: http.Server;
  let url: string;
  beforeAll(async () => {
    server = http.createServer(async (req, res) => {
      const chunks: Buffer[] = [];
      for await (const c of req) chunks.push(c as Buffer);
      const a = await handlePaymentWebhook(db, Buffer.concat(chunks).toString("utf8"), (req.headers["stripe-signature"] as string) ?? null);
      res.writeHead(a.status, { "content-type": "application/json" }).end(JSON.stringify(a.body));
    });
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
    url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/payments/webhook`;
    await paymentsClient().webhookEndpoints.create({ url, enabled_events: ["payment_intent.succeeded"] });
  });
  afterAll(() => new Promise<void>((r) => server.close(() => r())));

  it("creates and confirms a PaymentIntent; the fake's signed webhook marks the deposit paid and the customer is e-mailed", async () => {
    const { fx, wo, deposit } = await workOrderWithPendingDeposit("");
    const intent = await startDepositPayment({
      depositId: deposit.id,
      amountMinor: 5000,
      currency: "GBP",
      shopId: fx.shopId,
      workOrderId: wo.id,
      description: "deposit",
    });
    expect(intent.status).toBe("succeeded");
    await attachPaymentIntent(db, deposit.id, intent.id);
    // the fake delivers the event shortly after confirming; wait for the deposit to turn paid
    const until = Date.now() + 5000;
    while ((await depositStatus(deposit.id)) !== "paid" && Date.now() < until) await new Promise((r) => setTimeout(r, 100));
    expect(await depositStatus(deposit.id)).toBe("paid");
    const events = await paymentsClient().events.list({ limit: 20 });
    expect(events.data.some((e) => e.type === "payment_intent.succeeded" && (e.data.object as { id: string }).id === intent.id)).toBe(true);
    const retrieved = await paymentsClient().paymentIntents.retrieve(intent.id);
    expect(retrieved).toMatchObject({ amount: 5000, currency: "gbp", status: "succeeded", metadata: { deposit_id: deposit.id } });
    const customer = await db.selectFrom("customers").select("email").where("id", "=", fx.customerId).executeTakeFirstOrThrow();
    const mails = await mailTo(ports.mailWeb, customer.email!);
    expect(mails.map((m) => m.subject)).toContain(`Deposit received for work order ${wo.number}`);
  });
});

describe("a declined deposit", () => {
  it("is marked failed by the fake's signed payment_failed event, and can be paid again", async () => {
    // the webhook server of the previous block is closed, so run one for this block
    const server = http.createServer(async (req, res) => {
      const chunks: Buffer[] = [];
      for await (const c of req) chunks.push(c as Buffer);
      const a = await handlePaymentWebhook(
        db,
        Buffer.concat(chunks).toString("utf8"),
        (req.headers["stripe-signature"] as string) ?? null,
        { sendMail: false },
      );
      res.writeHead(a.status, { "content-type": "application/json" }).end(JSON.stringify(a.body));
    });
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
    try {
      await paymentsClient().webhookEndpoints.create({
        url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/payments/webhook`,
        enabled_events: ["payment_intent.payment_failed"],
      });
      const { fx, wo, deposit, quoteId, cust } = await workOrderWithPendingDeposit("");
      process.env.STRIPE_TEST_PAYMENT_METHOD = "pm_card_chargeDeclined";
      const intent = await startDepositPayment({
        depositId: deposit.id,
        amountMinor: 5000,
        currency: "GBP",
        shopId: fx.shopId,
        workOrderId: wo.id,
        description: "deposit",
      }).finally(() => {
        delete process.env.STRIPE_TEST_PAYMENT_METHOD;
      });
      expect(intent.status).toBe("requires_payment_method");
      await attachPaymentIntent(db, deposit.id, intent.id);
      const until = Date.now() + 5000;
      while ((await depositStatus(deposit.id)) !== "failed" && Date.now() < until) await new Promise((r) => setTimeout(r, 100));
      expect(await depositStatus(deposit.id)).toBe("failed");
      const again = await openDeposit(db, cust, quoteId);
      expect(again.deposit.id).not.toBe(deposit.id);
      expect(again.deposit.status).toBe("pending");
    } finally {
      await new Promise<void>((r) => server.close(() => r()));
    }
  });
});

describe("starting a payment", () => {
  it("is refused on a job that was cancelled after its quote was approved, and nothing is charged", async () => {
    const { fx, wo, quoteId, cust } = await workOrderWithPendingDeposit("pi_unused_" + Date.now());
    await db.updateTable("deposits").set({ status: "failed" }).where("quote_id", "=", quoteId).execute();
    await moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "cancelled", { note: "Customer took the bike elsewhere" });
    await expect(openDeposit(db, cust, quoteId)).rejects.toMatchObject({
      status: 409,
      message: "This job is cancelled: no deposit is taken on it. Ask the workshop if you think that is wrong.",
    });
    const pending = await db.selectFrom("deposits").select("id").where("quote_id", "=", quoteId).where("status", "=", "pending").execute();
    expect(pending).toEqual([]);
  });

  it("tells the customer plainly when the payment service cannot be reached, without its internals", async () => {
    const { fx, wo, deposit } = await workOrderWithPendingDeposit("");
    const base = process.env.STRIPE_API_BASE;
    process.env.STRIPE_API_BASE = "http://127.0.0.1:9"; // nothing listens there
    try {
      const e = await startDepositPayment({
        depositId: deposit.id,
        amountMinor: 5000,
        currency: "GBP",
        shopId: fx.shopId,
        workOrderId: wo.id,
        description: "deposit",
      }).catch((err: unknown) => err as Error & { status?: number });
      expect(e).toMatchObject({
        status: 409,
        message: "The payment service could not take the payment just now, and nothing was charged. Try again later, or ask the workshop.",
      });
    } finally {
      if (base === undefined) delete process.env.STRIPE_API_BASE;
      else process.env.STRIPE_API_BASE = base;
    }
  });
});

const refundedEvent = (pi: string, amountRefunded: number, currency = "gbp") =>
  JSON.stringify({
    id: `evt_test_${Math.random().toString(36).slice(2)}`,
    object: "event",
    type: "charge.refunded",
    created: Math.floor(Date.now() / 1000),
    data: {
      object: {
        id: `ch_${Math.random().toString(36).slice(2)}`,
        object: "charge",
        payment_intent: pi,
        amount: 5000,
        amount_refunded: amountRefunded,
        currency,
        refunded: amountRefunded === 5000,
      },
    },
  });

describe("a refund made at the payment provider", () => {
  const post = (body: string) => handlePaymentWebhook(db, body, sign(body), { secret: SECRET, sendMail: false });
  const row = async (id: string) =>
    db.selectFrom("deposits").select(["status", "refunded_minor"]).where("id", "=", id).executeTakeFirstOrThrow();

  it("in part is kept on the deposit; in full makes it refunded, so it no longer lets the job into build, and a late success does not undo it", async () => {
    const pi = `pi_refund_${Math.random().toString(36).slice(2)}`;
    const { fx, wo, deposit } = await workOrderWithPendingDeposit(pi);
    expect((await post(succeededEvent(pi))).body.outcome).toBe("deposit paid");

    // a refund for a currency or amount that is not this payment's changes nothing
    expect((await post(refundedEvent(pi, 9000))).body.outcome).toMatch(/^ignored: refund amount or currency does not match/);
    expect((await post(refundedEvent(pi, 1000, "eur"))).body.outcome).toMatch(/^ignored/);
    expect(await row(deposit.id)).toEqual({ status: "paid", refunded_minor: 0 });

    expect((await post(refundedEvent(pi, 1500))).body.outcome).toBe("deposit partly refunded");
    expect(await row(deposit.id)).toEqual({ status: "paid", refunded_minor: 1500 });

    expect((await post(refundedEvent(pi, 5000))).body.outcome).toBe("deposit refunded");
    expect(await row(deposit.id)).toEqual({ status: "refunded", refunded_minor: 5000 });
    // the provider's events out of order: the earlier total of 1500 arriving late changes nothing
    expect((await post(refundedEvent(pi, 1500))).body.outcome).toBe("ignored: an earlier refund total than the one on record");
    expect(await row(deposit.id)).toEqual({ status: "refunded", refunded_minor: 5000 });

    // the deposit no longer counts as paid: the job cannot go into build on it
    await expect(moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "in_build")).rejects.toThrow(/deposit/i);
    // a success sent again under a new event id does not make it paid again
    expect((await post(succeededEvent(pi))).body.outcome).toBe("ignored: the deposit was refunded");
    expect((await row(deposit.id)).status).toBe("refunded");
    const audit = await db
      .selectFrom("audit_log")
      .select(["action", "outcome"])
      .where("entity_id", "=", deposit.id)
      .where("action", "like", "deposit.%refunded")
      .orderBy("id")
      .execute();
    expect(audit).toEqual([
      { action: "deposit.refunded", outcome: "refused" },
      { action: "deposit.refunded", outcome: "refused" },
      { action: "deposit.partly-refunded", outcome: "accepted" },
      { action: "deposit.refunded", outcome: "accepted" },
      { action: "deposit.refunded", outcome: "refused" }, // the earlier total, delivered late
    ]);
  });

  it("of a payment never paid changes nothing", async () => {
    const pi = `pi_refund_${Math.random().toString(36).slice(2)}`;
    const { deposit } = await workOrderWithPendingDeposit(pi);
    expect((await post(refundedEvent(pi, 5000))).body.outcome).toBe("ignored: the deposit is pending, not paid");
    expect(await row(deposit.id)).toEqual({ status: "pending", refunded_minor: 0 });
  });
});

describe("a deposit confirmed after its job was closed", () => {
  it("is recorded as paid (the money came) and audited to be given back; the receipt says no work starts", async () => {
    const pi = `pi_closed_${Math.random().toString(36).slice(2)}`;
    const { fx, wo, deposit } = await workOrderWithPendingDeposit(pi);
    // the office cancels the job while the customer's card is being charged
    await moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "cancelled");
    const body = succeededEvent(pi);
    expect((await handlePaymentWebhook(db, body, sign(body), { secret: SECRET })).body.outcome).toBe("deposit paid");
    expect(await depositStatus(deposit.id)).toBe("paid");
    const audit = await db
      .selectFrom("audit_log")
      .select(["outcome", "reason"])
      .where("entity_id", "=", deposit.id)
      .where("action", "=", "deposit.paid")
      .executeTakeFirstOrThrow();
    expect(audit).toEqual({ outcome: "accepted", reason: "paid after the job was closed (cancelled): to be given back" });
    const mail = await db
      .selectFrom("mail_outbox")
      .select("body")
      .where("work_order_id", "=", wo.id)
      .where("kind", "=", "deposit_received")
      .executeTakeFirstOrThrow();
    expect(mail.body).toContain("had already been closed (cancelled): no work starts on it. We will be in touch to give the deposit back.");
    expect(mail.body).not.toContain("Work can start");
    // listed for the office until the provider reports the refund; then the deposit is refunded too
    expect(await openGiveBacks(db, fx.shopId)).toEqual([
      expect.objectContaining({
        paymentIntentId: pi,
        amountMinor: 5000,
        givenBackMinor: 0,
        reason: "Paid after the job was closed (cancelled).",
      }),
    ]);
    const refund = refundedEvent(pi, 5000);
    expect((await handlePaymentWebhook(db, refund, sign(refund), { secret: SECRET, sendMail: false })).body.outcome).toBe(
      "deposit refunded",
    );
    expect(await depositStatus(deposit.id)).toBe("refunded");
    expect(await openGiveBacks(db, fx.shopId)).toEqual([]);
  });
});

describe("a card that failed and went through later, beside a new try", () => {
  const post = (body: string) => handlePaymentWebhook(db, body, sign(body), { secret: SECRET, sendMail: false });
  const failedEvent = (pi: string) =>
    JSON.stringify({
      id: `evt_test_${Math.random().toString(36).slice(2)}`,
      object: "event",
      type: "payment_intent.payment_failed",
      created: Math.floor(Date.now() / 1000),
      data: { object: { id: pi, object: "payment_intent", amount: 5000, currency: "gbp", status: "requires_payment_method" } },
    });
  const statuses = async (quoteId: string) =>
    (await db.selectFrom("deposits").select(["id", "status"]).where("quote_id", "=", quoteId).orderBy("created_at").execute()).map(
      (d) => d.status,
    );
  const givenBack = async (depositId: string) =>
    db
      .selectFrom("audit_log")
      .select(["outcome", "reason"])
      .where("entity_id", "=", depositId)
      .where("action", "=", "deposit.paid")
      .execute();
  const tryAgain = async (cust: Parameters<typeof openDeposit>[1], quoteId: string) => {
    const pi = `pi_retry_${Math.random().toString(36).slice(2)}`;
    const { deposit } = await openDeposit(db, cust, quoteId);
    await attachPaymentIntent(db, deposit.id, pi);
    return { pi, deposit };
  };

  it("the new try paid first: the late success is answered, not counted, and left on the audit log to be given back", async () => {
    const first = `pi_first_${Math.random().toString(36).slice(2)}`;
    const { fx, deposit, quoteId, cust } = await workOrderWithPendingDeposit(first);
    expect((await post(failedEvent(first))).body.outcome).toMatch(/failed/);
    const retry = await tryAgain(cust, quoteId);
    expect(retry.deposit.id).not.toBe(deposit.id);
    expect((await post(succeededEvent(retry.pi))).body.outcome).toBe("deposit paid");

    const late = await post(succeededEvent(first));
    expect([late.status, late.body.outcome]).toEqual([200, "ignored: the deposit is paid already by another payment"]);
    expect(await statuses(quoteId)).toEqual(["failed", "paid"]);
    expect(await givenBack(deposit.id)).toEqual([
      { outcome: "refused", reason: "taken after the deposit was paid by another payment: to be given back" },
    ]);
    await expect(openDeposit(db, cust, quoteId)).rejects.toThrow("The deposit is already paid.");

    // the office sees it to give back; a part refunded at the provider is kept, in full it leaves the list
    expect(await openGiveBacks(db, fx.shopId)).toEqual([
      expect.objectContaining({ paymentIntentId: first, paymentFor: "deposit", amountMinor: 5000, currency: "GBP", givenBackMinor: 0 }),
    ]);
    expect((await post(succeededEvent(first))).body.outcome).toMatch(/^ignored/); // resent: still one line
    expect(await openGiveBacks(db, fx.shopId)).toHaveLength(1);
    expect((await post(refundedEvent(first, 9000))).body.outcome).toMatch(/^ignored/); // more than was taken
    expect((await post(refundedEvent(first, 2000))).body.outcome).toBe("deposit partly given back");
    expect(await openGiveBacks(db, fx.shopId)).toEqual([expect.objectContaining({ givenBackMinor: 2000 })]);
    expect((await post(refundedEvent(first, 5000))).body.outcome).toBe("deposit given back");
    expect(await openGiveBacks(db, fx.shopId)).toEqual([]);
    // an earlier total delivered late does not bring the line back
    expect((await post(refundedEvent(first, 2000))).body.outcome).toMatch(/^ignored/);
    expect(await openGiveBacks(db, fx.shopId)).toEqual([]);
    // the deposits as they were: the one that counts is still paid
    expect(await statuses(quoteId)).toEqual(["failed", "paid"]);
  });

  it("the late success came first: it counts, a new payment is not offered, and the new try's success is the one given back", async () => {
    const first = `pi_first_${Math.random().toString(36).slice(2)}`;
    const { deposit, quoteId, cust } = await workOrderWithPendingDeposit(first);
    expect((await post(failedEvent(first))).body.outcome).toMatch(/failed/);
    const retry = await tryAgain(cust, quoteId);

    expect((await post(succeededEvent(first))).body.outcome).toBe("deposit paid");
    expect(await statuses(quoteId)).toEqual(["paid", "pending"]);
    // the customer's page asks to pay again: the deposit is paid, whatever try is still open
    await expect(openDeposit(db, cust, quoteId)).rejects.toThrow("The deposit is already paid.");
    expect((await post(succeededEvent(retry.pi))).body.outcome).toBe("ignored: the deposit is paid already by another payment");
    // the try that was given back is closed: it is never offered again
    expect(await statuses(quoteId)).toEqual(["paid", "failed"]);
    expect(await givenBack(retry.deposit.id)).toEqual([
      { outcome: "refused", reason: "taken after the deposit was paid by another payment: to be given back" },
    ]);
    expect(await givenBack(deposit.id)).toEqual([{ outcome: "accepted", reason: null }]);
  });
});

describe("money to give back already on the audit log (migration 210's backfill)", () => {
  const post = (body: string) => handlePaymentWebhook(db, body, sign(body), { secret: SECRET, sendMail: false });

  it("lists it with what went back already: refunded in full is not listed as open, a part refunded shows", async () => {
    // a deposit paid on a cancelled job and refunded in full since, as the payment's row keeps it
    const closedPi = `pi_backfill_closed_${Math.random().toString(36).slice(2)}`;
    const closed = await workOrderWithPendingDeposit(closedPi);
    await moveWorkOrder(db, closed.fx.shopId, closed.fx.users.office.id, closed.wo.id, "cancelled");
    expect((await post(succeededEvent(closedPi))).body.outcome).toBe("deposit paid");
    expect((await post(refundedEvent(closedPi, 5000))).body.outcome).toBe("deposit refunded");
    // a late success refused before the list existed, with a refund of 20.00 the old code refused ("not paid")
    const latePi = `pi_backfill_late_${Math.random().toString(36).slice(2)}`;
    const late = await workOrderWithPendingDeposit(latePi);
    await db.updateTable("deposits").set({ status: "failed" }).where("id", "=", late.deposit.id).execute();
    const oldAudit = (action: string, outcome: "accepted" | "refused", reason: string, detail: object) =>
      db
        .insertInto("audit_log")
        .values({
          shop_id: late.fx.shopId,
          actor_id: null,
          action,
          entity: "deposit",
          entity_id: late.deposit.id,
          work_order_id: late.wo.id,
          outcome,
          reason,
          detail: JSON.stringify(detail),
        })
        .execute();
    await oldAudit("deposit.paid", "refused", "taken after the deposit was paid by another payment: to be given back", {
      paymentIntentId: latePi,
    });
    await oldAudit("deposit.refunded", "refused", "the deposit is failed, not paid", { amountRefunded: 2000 });

    await db.deleteFrom("money_to_give_back").where("payment_intent_id", "in", [closedPi, latePi]).execute();
    await backfillGiveBacks(db as unknown as Kysely<unknown>);
    await backfillGiveBacks(db as unknown as Kysely<unknown>); // twice: nothing more
    const rows = await db
      .selectFrom("money_to_give_back")
      .select(["payment_intent_id", "given_back_minor", "reason"])
      .select((eb) => eb("given_back_at", "is not", null).as("done"))
      .where("payment_intent_id", "in", [closedPi, latePi])
      .orderBy("payment_intent_id")
      .execute();
    expect(rows).toEqual([
      { payment_intent_id: closedPi, given_back_minor: 5000, reason: "Paid after the job was closed.", done: true },
      { payment_intent_id: latePi, given_back_minor: 2000, reason: "Taken after the deposit was paid by another payment.", done: false },
    ]);
    expect((await openGiveBacks(db, closed.fx.shopId)).map((g) => g.paymentIntentId)).not.toContain(closedPi);
    expect((await openGiveBacks(db, late.fx.shopId)).filter((g) => g.paymentIntentId === latePi)).toEqual([
      expect.objectContaining({ givenBackMinor: 2000 }),
    ]);
  });
});
