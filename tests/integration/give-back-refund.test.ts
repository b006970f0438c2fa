import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { POST as refundRoute } from "@/app/api/office/give-backs/[id]/refund/route";
import { paymentsClient, startDepositPayment } from "@/app/_server/payments";
import { openGiveBacks } from "@/db/office/give-backs";
import type { SessionUser } from "@/lib/auth/session-user";
import { closeOutJob, type CloseOutJob } from "./support/close-out";
import { useFakes } from "./support/fakes";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
useFakes();

// The office gives money back from its list: Benchtag asks the payment provider (the local fake,
// through the SDK) for the refund of what is left, once only however often it is pressed; the line
// stays until the provider reports the refund (its webhook: tests/integration/payment-webhook.test.ts).

const ask = (giveBackId: string, user: SessionUser) =>
  refundRoute.handle(appRequest(`/api/office/give-backs/${giveBackId}/refund`, { method: "POST" }), {
    user,
    db,
    params: { id: giveBackId },
  });

/** A deposit of £50.00 the provider took (a real payment intent in the fake) that the shop must give back. */
async function moneyToGiveBack(job: CloseOutJob, givenBackMinor = 0) {
  const intent = await startDepositPayment({
    depositId: randomUUID(),
    amountMinor: 5000,
    currency: "GBP",
    shopId: job.fx.shopId,
    workOrderId: job.workOrderId,
    description: "deposit taken twice",
  });
  expect(intent.status).toBe("succeeded");
  const row = await db
    .insertInto("money_to_give_back")
    .values({
      shop_id: job.fx.shopId,
      work_order_id: job.workOrderId,
      payment_for: "deposit",
      payment_id: randomUUID(),
      payment_intent_id: intent.id,
      amount_minor: 5000,
      currency: "GBP",
      reason: "taken after the deposit was paid by another payment",
      given_back_minor: givenBackMinor,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return { id: row.id, intentId: intent.id };
}

const refundedAtProvider = async (intentId: string) =>
  ((await paymentsClient().paymentIntents.retrieve(intentId)) as unknown as { amount_refunded?: number }).amount_refunded ?? 0;

describe("giving money back through the payment provider (real PostgreSQL, fake provider)", () => {
  it("asks the provider for what is left; pressing again asks nothing twice; the line stays until the provider reports it", async () => {
    const job = await closeOutJob(db);
    const g = await moneyToGiveBack(job);

    const first = await ask(g.id, job.users.office);
    expect(first.status).toBe(202);
    expect(await first.json()).toMatchObject({
      askedMinor: 5000,
      currency: "GBP",
      message: "Asked the payment provider to give back £50.00. The line goes when it reports the refund.",
    });
    expect(await refundedAtProvider(g.intentId)).toBe(5000);
    // no webhook reached this test: the line is still listed, and a second press refunds nothing more
    expect((await openGiveBacks(db, job.fx.shopId)).map((x) => x.id)).toEqual([g.id]);
    const again = await ask(g.id, job.users.office);
    expect(again.status).toBe(202);
    expect(await refundedAtProvider(g.intentId)).toBe(5000);

    const audit = await db
      .selectFrom("audit_log")
      .select(["outcome", "actor_id", "detail"])
      .where("action", "=", "payment.refund-asked")
      .where("entity_id", "=", g.id)
      .orderBy("id")
      .execute();
    expect(audit.map((a) => [a.outcome, a.actor_id])).toEqual([
      ["accepted", job.users.office.id],
      ["accepted", job.users.office.id],
    ]);
    expect(audit[0].detail).toMatchObject({ paymentIntentId: g.intentId, amountMinor: 5000, currency: "GBP" });
  });

  it("a part given back already: only the rest is asked for", async () => {
    const job = await closeOutJob(db);
    const g = await moneyToGiveBack(job);
    await paymentsClient().refunds.create({ payment_intent: g.intentId, amount: 1500 });
    await db.updateTable("money_to_give_back").set({ given_back_minor: 1500 }).where("id", "=", g.id).execute();
    const r = await ask(g.id, job.users.office);
    expect(r.status).toBe(202);
    expect((await r.json()).askedMinor).toBe(3500);
    expect(await refundedAtProvider(g.intentId)).toBe(5000);
  });

  it("refused in workshop words: given back already, the provider says no, another shop's line, a mechanic", async () => {
    const job = await closeOutJob(db);
    const g = await moneyToGiveBack(job);

    // refunded in the provider's dashboard, not reported here yet: the provider refuses, nothing changes, the refusal is audited
    await paymentsClient().refunds.create({ payment_intent: g.intentId });
    const refused = await ask(g.id, job.users.office);
    expect(refused.status).toBe(409);
    expect((await refused.json()).error).toMatch(
      /^The payment service did not give the money back\. It said: .*If it says the payment is refunded already/,
    );
    const [audited] = await db
      .selectFrom("audit_log")
      .select(["outcome", "reason"])
      .where("action", "=", "payment.refund-asked")
      .where("entity_id", "=", g.id)
      .execute();
    expect(audited).toMatchObject({ outcome: "refused", reason: expect.stringMatching(/did not give the money back/) });

    await db.updateTable("money_to_give_back").set({ given_back_minor: 5000, given_back_at: new Date() }).where("id", "=", g.id).execute();
    const done = await ask(g.id, job.users.office);
    expect(done.status).toBe(409);
    expect((await done.json()).error).toBe("This money is given back already: the payment provider reported the refund in full.");

    const other = await closeOutJob(db);
    const theirs = await moneyToGiveBack(other);
    const elsewhere = await ask(theirs.id, job.users.office);
    expect(elsewhere.status).toBe(404);
    expect(await refundedAtProvider(theirs.intentId)).toBe(0);
    expect((await ask(theirs.id, other.users.mech)).status).toBe(403);
    expect(await refundedAtProvider(theirs.intentId)).toBe(0);
  });

  it("no answer from the provider: the office is told the money may have gone back, not that nothing changed", async () => {
    const job = await closeOutJob(db);
    const g = await moneyToGiveBack(job);
    const base = process.env.STRIPE_API_BASE;
    process.env.STRIPE_API_BASE = "http://127.0.0.1:9"; // nothing listens there
    try {
      const r = await ask(g.id, job.users.office);
      expect(r.status).toBe(409);
      expect((await r.json()).error).toMatch(/^The payment service gave no clear answer, so the money may or may not have gone back\./);
    } finally {
      process.env.STRIPE_API_BASE = base;
    }
    expect(await refundedAtProvider(g.intentId)).toBe(0);
    expect((await openGiveBacks(db, job.fx.shopId)).map((x) => x.id)).toContain(g.id);
  });
});
