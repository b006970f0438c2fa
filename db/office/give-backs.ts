import "server-only";
import type { Kysely, Transaction } from "kysely";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";

// Money the payment provider took that the shop must give back (migration 210): written by the
// payment webhook where it answers a payment it does not count, or counts one on a closed job;
// listed for the office until the provider reports the refund. The office asks the provider for
// the refund from the list (app/api/office/give-backs/[id]/refund) or makes it in the provider's
// dashboard; either way the row is given back when the provider reports it.

export interface GiveBack {
  shopId: string;
  workOrderId: string;
  paymentFor: "deposit" | "balance";
  paymentId: string;
  paymentIntentId: string;
  amountMinor: number;
  currency: string;
  reason: string;
}

/** Records money to give back (once per payment intent: a resent event adds nothing). */
export async function recordGiveBack(trx: Transaction<Database>, g: GiveBack): Promise<void> {
  await trx
    .insertInto("money_to_give_back")
    .values({
      shop_id: g.shopId,
      work_order_id: g.workOrderId,
      payment_for: g.paymentFor,
      payment_id: g.paymentId,
      payment_intent_id: g.paymentIntentId,
      amount_minor: g.amountMinor,
      currency: g.currency,
      reason: g.reason,
    })
    .onConflict((oc) => oc.column("payment_intent_id").doNothing())
    .execute();
}

/**
 * A refund the provider reports on a payment intent that has money to give back: how much went
 * back in all is kept, and in full it is given back. Returns the row's state after, or null when
 * the intent has none, or the refund does not fit it (another currency, more than was taken).
 */
export async function applyGivenBack(
  trx: Transaction<Database>,
  paymentIntentId: string,
  refund: { amountRefunded: number | null | undefined; currency: string | null },
): Promise<{ id: string; givenBackMinor: number; whole: boolean } | null> {
  const row = await trx
    .selectFrom("money_to_give_back")
    .select(["id", "amount_minor", "currency", "given_back_minor", "given_back_at"])
    .where("payment_intent_id", "=", paymentIntentId)
    .forUpdate()
    .executeTakeFirst();
  const refunded = refund.amountRefunded;
  if (!row || typeof refunded !== "number" || !Number.isInteger(refunded) || refunded <= 0 || refunded > row.amount_minor) return null;
  if ((refund.currency ?? "").toUpperCase() !== row.currency.toUpperCase()) return null;
  // the provider's figure is the total so far, and its events may come out of order: an earlier, smaller total changes nothing
  if (refunded <= Number(row.given_back_minor)) return null;
  const whole = refunded === row.amount_minor;
  await trx
    .updateTable("money_to_give_back")
    .set({ given_back_minor: refunded, given_back_at: whole ? (row.given_back_at ?? new Date()) : null })
    .where("id", "=", row.id)
    .execute();
  return { id: row.id, givenBackMinor: refunded, whole };
}

/** The shop's money still to give back (not refunded in full yet), oldest first, with the job. */
export async function openGiveBacks(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("money_to_give_back as g")
    .innerJoin("work_orders as w", "w.id", "g.work_order_id")
    .select([
      "g.id",
      "g.work_order_id as workOrderId",
      "w.number",
      "g.payment_for as paymentFor",
      "g.payment_intent_id as paymentIntentId",
      "g.amount_minor as amountMinor",
      "g.given_back_minor as givenBackMinor",
      "g.currency",
      "g.reason",
      "g.recorded_at as recordedAt",
    ])
    .where("g.shop_id", "=", shopId)
    .where("g.given_back_at", "is", null)
    .orderBy("g.recorded_at")
    .limit(200)
    .execute();
}

/** One row of money to give back, in the shop (null when there is none). */
export async function giveBackInShop(db: Kysely<Database>, shopId: string, id: string) {
  return db
    .selectFrom("money_to_give_back")
    .select([
      "id",
      "work_order_id as workOrderId",
      "payment_intent_id as paymentIntentId",
      "amount_minor as amountMinor",
      "given_back_minor as givenBackMinor",
      "given_back_at as givenBackAt",
      "currency",
    ])
    .where("id", "=", id)
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
}

/** The office's request to the provider for a refund, on the audit log: asked, or refused with the provider's words. */
export async function auditRefundAsked(
  db: Kysely<Database>,
  a: {
    shopId: string;
    actorId: string;
    giveBackId: string;
    workOrderId: string;
    paymentIntentId: string;
    amountMinor: number;
    currency: string;
  },
  outcome: { refundId: string } | { refused: string },
): Promise<void> {
  await appendAudit(db, [
    {
      shopId: a.shopId,
      actorId: a.actorId,
      action: "payment.refund-asked",
      entity: "money_to_give_back",
      entityId: a.giveBackId,
      workOrderId: a.workOrderId,
      outcome: "refundId" in outcome ? "accepted" : "refused",
      reason: "refused" in outcome ? outcome.refused : null,
      detail: { paymentIntentId: a.paymentIntentId, amountMinor: a.amountMinor, currency: a.currency, ...outcome },
    },
  ]);
}
