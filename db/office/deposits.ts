import "server-only";
import { sql, type Kysely, type Transaction } from "kysely";
import type { DepositStatus } from "@/lib/office/schemas";
import { Refusal } from "@/lib/errors";
import { isUuid } from "@/lib/ids";
import { isClosed, STATUS_LABELS } from "@/lib/work-orders/status";
import { appendAudit } from "../audit/append";
import { applyGivenBack, recordGiveBack } from "./give-backs";
import type { Database } from "../schema";

// Starts a deposit for the customer's approved quote: a pending row the payment provider's
// intent is then tied to. A pending or paid deposit is reused, so a double click pays once.
export async function openDeposit(db: Kysely<Database>, user: { id: string; shopId: string; customerId: string | null }, quoteId: string) {
  return db.transaction().execute(async (trx) => {
    // the job's row first, then its quote, as everywhere (lockQuoteWithOwner): the other order could
    // deadlock with the customer's approval of the same quote
    const owner = await trx.selectFrom("quotes").select("work_order_id").where("id", "=", quoteId).executeTakeFirst();
    if (!owner) throw new Refusal("This quote is not yours.", 403);
    // the job's status under its own lock: a cancel at this moment is seen, or waits for this
    const job = await trx
      .selectFrom("work_orders")
      .select("status")
      .where("id", "=", owner.work_order_id)
      .forShare()
      .executeTakeFirstOrThrow();
    const q = await trx
      .selectFrom("quotes as q")
      .innerJoin("work_orders as w", "w.id", "q.work_order_id")
      .innerJoin("bikes as b", "b.id", "w.bike_id")
      .select([
        "q.id",
        "q.status",
        "q.deposit_minor as depositMinor",
        "q.currency",
        "q.work_order_id as workOrderId",
        "b.customer_id as customerId",
        "q.shop_id as shopId",
        "w.number",
      ])
      .where("q.id", "=", quoteId)
      .forUpdate("q")
      .executeTakeFirst();
    if (!q || q.shopId !== user.shopId || q.customerId !== user.customerId) throw new Refusal("This quote is not yours.", 403);
    if (isClosed(job.status))
      throw new Refusal(
        `This job is ${STATUS_LABELS[job.status].toLowerCase()}: no deposit is taken on it. Ask the workshop if you think that is wrong.`,
        409,
      );
    if (q.status !== "approved") throw new Refusal("Approve the quote before paying the deposit.", 409);
    if (q.depositMinor <= 0) throw new Refusal("No deposit is asked for this quote.", 409);
    // a paid one first: a card that failed and went through later may have paid while a new try waits
    const existing = await trx
      .selectFrom("deposits")
      .selectAll()
      .where("quote_id", "=", quoteId)
      .where("status", "in", ["pending", "paid"])
      .orderBy(sql`status = 'paid'`, "desc")
      .orderBy("created_at", "desc")
      .executeTakeFirst();
    if (existing?.status === "paid") throw new Refusal("The deposit is already paid.", 409);
    const deposit =
      existing ??
      (await trx
        .insertInto("deposits")
        .values({
          shop_id: q.shopId,
          work_order_id: q.workOrderId,
          quote_id: q.id,
          amount_minor: q.depositMinor,
          currency: q.currency,
          status: "pending",
          payment_intent_id: null,
          paid_at: null,
        })
        .returningAll()
        .executeTakeFirstOrThrow());
    return { deposit, workOrderNumber: q.number };
  });
}

export async function attachPaymentIntent(db: Kysely<Database>, depositId: string, paymentIntentId: string) {
  await db
    .updateTable("deposits")
    .set({ payment_intent_id: paymentIntentId })
    .where("id", "=", depositId)
    .where("payment_intent_id", "is", null)
    .execute();
}

/** What a payment is for: a quote's deposit or a bill's balance (db/office/balance-payments.ts). */
export type PaymentFor = "deposit" | "balance";

type PaymentOutcome =
  | {
      kind: "paid";
      paymentFor: PaymentFor;
      paymentId: string;
      shopId: string;
      workOrderId: string;
      amountMinor: number;
      newlyPaid: boolean;
    }
  | { kind: "failed"; paymentFor: PaymentFor; paymentId: string }
  | { kind: "refunded"; paymentFor: PaymentFor; paymentId: string; refundedMinor: number; whole: boolean }
  /** A refund of money taken to be given back (db/office/give-backs.ts), on a payment that does not count. */
  | { kind: "given-back"; paymentFor: PaymentFor; paymentId: string; refundedMinor: number; whole: boolean }
  | { kind: "replayed" }
  | { kind: "ignored"; reason: string };

interface Payable {
  paymentFor: PaymentFor;
  id: string;
  shop_id: string;
  work_order_id: string;
  amount_minor: number;
  currency: string;
  status: DepositStatus;
  /** How much of it the provider has given back in all (minor units). */
  refunded_minor: number;
}

/** The row a payment was started for, as the payment's metadata names it (set when it was created). */
export interface PaymentNamed {
  depositId?: string | null;
  balancePaymentId?: string | null;
}

/**
 * The deposit or balance payment a payment intent was started for, locked: the row the intent is
 * tied to, or else the row its metadata names that is tied to no intent yet, which is tied to it
 * now. The provider may report the payment before the route that started it has tied the intent to
 * its row (the event comes the moment the payment is confirmed), and that report is the only one.
 */
async function payableOf(trx: Transaction<Database>, paymentIntentId: string, named: PaymentNamed = {}): Promise<Payable | null> {
  const cols = ["id", "shop_id", "work_order_id", "amount_minor", "currency", "status", "refunded_minor"] as const;
  const dep = await trx.selectFrom("deposits").select(cols).where("payment_intent_id", "=", paymentIntentId).forUpdate().executeTakeFirst();
  if (dep) return { paymentFor: "deposit", ...dep };
  const bal = await trx
    .selectFrom("balance_payments")
    .select(cols)
    .where("payment_intent_id", "=", paymentIntentId)
    .forUpdate()
    .executeTakeFirst();
  if (bal) return { paymentFor: "balance", ...bal, amount_minor: Number(bal.amount_minor), refunded_minor: Number(bal.refunded_minor) };
  if (named.depositId && isUuid(named.depositId)) {
    const d = await trx
      .updateTable("deposits")
      .set({ payment_intent_id: paymentIntentId })
      .where("id", "=", named.depositId)
      .where("payment_intent_id", "is", null)
      .returning(cols)
      .executeTakeFirst();
    if (d) return { paymentFor: "deposit", ...d };
  }
  if (named.balancePaymentId && isUuid(named.balancePaymentId)) {
    const b = await trx
      .updateTable("balance_payments")
      .set({ payment_intent_id: paymentIntentId })
      .where("id", "=", named.balancePaymentId)
      .where("payment_intent_id", "is", null)
      .returning(cols)
      .executeTakeFirst();
    if (b) return { paymentFor: "balance", ...b, amount_minor: Number(b.amount_minor), refunded_minor: Number(b.refunded_minor) };
  }
  return null;
}

/**
 * Another deposit of the same quote is paid. The quote is locked first, so of two payments of one
 * quote confirmed at once, the second sees the first.
 */
async function quoteDepositPaidOtherwise(trx: Transaction<Database>, depositId: string): Promise<boolean> {
  const me = await trx.selectFrom("deposits").select("quote_id").where("id", "=", depositId).executeTakeFirstOrThrow();
  await trx.selectFrom("quotes").select("id").where("id", "=", me.quote_id).forUpdate().execute();
  const other = await trx
    .selectFrom("deposits")
    .select("id")
    .where("quote_id", "=", me.quote_id)
    .where("id", "!=", depositId)
    .where("status", "=", "paid")
    .executeTakeFirst();
  return other !== undefined;
}

/** The bill or the quote's deposit this payment is for is paid by another payment (a bill: or one is under way). */
const paidOtherwise = (trx: Transaction<Database>, p: Payable) =>
  p.paymentFor === "balance" ? billPaidOtherwise(trx, p.id) : quoteDepositPaidOtherwise(trx, p.id);

/** Another payment of the same bill is paid or under way (the bill holds one open payment at a time). */
async function billPaidOtherwise(trx: Transaction<Database>, balancePaymentId: string): Promise<boolean> {
  const other = await trx
    .selectFrom("balance_payments as me")
    .innerJoin("balance_payments as o", "o.invoice_id", "me.invoice_id")
    .select("o.id")
    .where("me.id", "=", balancePaymentId)
    .whereRef("o.id", "!=", "me.id")
    .where("o.status", "in", ["pending", "paid"])
    .executeTakeFirst();
  return other !== undefined;
}

/**
 * A refund made at the provider: how much of the payment went back in all is kept on the row, and a
 * payment refunded in full is 'refunded' (it no longer counts as paid: not for the move into build,
 * not on the bill). Only a paid payment can be refunded; the currency must match and the amount is
 * at most what was paid.
 */
async function applyRefund(
  trx: Transaction<Database>,
  dep: Payable,
  event: { id: string; currency: string | null; amountRefunded?: number | null },
  audit: (action: string, outcome: "accepted" | "refused", detail: Record<string, unknown>, reason?: string) => Promise<unknown>,
): Promise<PaymentOutcome> {
  const refunded = event.amountRefunded;
  const fits =
    typeof refunded === "number" &&
    Number.isSafeInteger(refunded) &&
    refunded > 0 &&
    refunded <= dep.amount_minor &&
    sameCurrency(event.currency, dep);
  if (!fits || (dep.status !== "paid" && dep.status !== "refunded")) {
    const reason = !fits ? "refund amount or currency does not match" : `the ${dep.paymentFor} is ${dep.status}, not paid`;
    await audit("refunded", "refused", { eventId: event.id, amountRefunded: refunded ?? null }, reason);
    return { kind: "ignored", reason };
  }
  // the provider's figure is the total so far, and its events may come out of order: an earlier, smaller total changes nothing
  if (refunded <= Number(dep.refunded_minor)) {
    await audit("refunded", "refused", { eventId: event.id, amountRefunded: refunded }, "an earlier refund total than the one on record");
    return { kind: "ignored", reason: "an earlier refund total than the one on record" };
  }
  const whole = refunded === dep.amount_minor;
  await updatePayable(trx, dep, { refunded_minor: refunded, ...(whole ? { status: "refunded" as const } : {}) });
  await audit(whole ? "refunded" : "partly-refunded", "accepted", {
    eventId: event.id,
    refundedMinor: refunded,
    amountMinor: dep.amount_minor,
  });
  return { kind: "refunded", paymentFor: dep.paymentFor, paymentId: dep.id, refundedMinor: refunded, whole };
}

/** Writes a deposit's or a balance payment's row, whichever the payment is. */
async function updatePayable(
  trx: Transaction<Database>,
  p: Payable,
  set: { status?: DepositStatus; paid_at?: Date; refunded_minor?: number },
): Promise<void> {
  if (p.paymentFor === "deposit") await trx.updateTable("deposits").set(set).where("id", "=", p.id).execute();
  else await trx.updateTable("balance_payments").set(set).where("id", "=", p.id).execute();
}

async function setPaymentStatus(trx: Transaction<Database>, p: Payable, status: "paid" | "failed") {
  await updatePayable(trx, p, status === "paid" ? { status, paid_at: new Date() } : { status });
}

/** The event's currency is the payment's (the provider writes it in lower case). */
const sameCurrency = (eventCurrency: string | null, p: Payable) => (eventCurrency ?? "").toUpperCase() === p.currency.toUpperCase();

/** What is still held of paid deposits, summed: each one's amount less what was refunded of it. */
export const heldOfDeposits = (table: "deposits" | "d" = "deposits") =>
  sql<number>`coalesce(sum(${sql.ref(`${table}.amount_minor`)} - ${sql.ref(`${table}.refunded_minor`)}), 0)`;

// Applies a verified payment event exactly once, to the deposit or the bill's balance payment it
// is about. A second delivery of the same event id is "replayed" (and changes nothing). Amount and
// currency must match the payment.
export async function applyPaymentEvent(
  db: Kysely<Database>,
  event: {
    id: string;
    type: string;
    paymentIntentId: string | null;
    amount: number | null;
    currency: string | null;
    /** What the payment's metadata names it for (used when the intent is not yet tied to its row). */
    named?: PaymentNamed;
    /** A refund (charge.refunded): how much of the payment has gone back in all, minor units. */
    amountRefunded?: number | null;
  },
  /** Run in the same transaction when this event is the one that paid: the receipt is queued with the payment, or neither is kept. */
  onNewlyPaid?: (trx: Transaction<Database>, paid: Extract<PaymentOutcome, { kind: "paid" }>) => Promise<void>,
): Promise<PaymentOutcome> {
  return db.transaction().execute(async (trx) => {
    const seen = await trx.selectFrom("payment_events").select("event_id").where("event_id", "=", event.id).executeTakeFirst();
    if (seen) return { kind: "replayed" } as const;
    const used =
      event.type === "payment_intent.succeeded" || event.type === "payment_intent.payment_failed" || event.type === "charge.refunded";
    if (!used || !event.paymentIntentId) return { kind: "ignored", reason: `event type ${event.type} is not used` } as const;
    const dep = await payableOf(trx, event.paymentIntentId, event.named);
    if (!dep) return { kind: "ignored", reason: "no deposit or balance payment for this payment" } as const;
    const what = dep.paymentFor;
    const inserted = await trx
      .insertInto("payment_events")
      .values({ event_id: event.id, type: event.type, payment_intent_id: event.paymentIntentId })
      .onConflict((oc) => oc.column("event_id").doNothing())
      .returning("event_id")
      .executeTakeFirst();
    if (!inserted) return { kind: "replayed" } as const;
    const audit = (action: string, outcome: "accepted" | "refused", detail: Record<string, unknown>, reason?: string) =>
      appendAudit(trx, [
        {
          shopId: dep.shop_id,
          actorId: null,
          action: `${what}.${action}`,
          entity: what,
          entityId: dep.id,
          workOrderId: dep.work_order_id,
          outcome,
          reason,
          detail,
        },
      ]);
    const toGiveBack = (reason: string) =>
      recordGiveBack(trx, {
        shopId: dep.shop_id,
        workOrderId: dep.work_order_id,
        paymentFor: what,
        paymentId: dep.id,
        paymentIntentId: event.paymentIntentId!,
        amountMinor: dep.amount_minor,
        currency: dep.currency,
        reason,
      });
    if (event.type === "payment_intent.payment_failed") {
      // a declined card: it can be paid again (a new row and payment intent)
      if (dep.status === "pending") {
        await setPaymentStatus(trx, dep, "failed");
        await audit("failed", "accepted", { eventId: event.id });
      }
      return { kind: "failed", paymentFor: what, paymentId: dep.id } as const;
    }
    if (event.type === "charge.refunded") {
      // money taken to be given back: the refund is kept on its row; a payment that counts is refunded as well
      const givenBack = await applyGivenBack(trx, event.paymentIntentId, {
        amountRefunded: event.amountRefunded,
        currency: event.currency,
      });
      if (givenBack && dep.status !== "paid") {
        await audit(givenBack.whole ? "given-back" : "partly-given-back", "accepted", {
          eventId: event.id,
          refundedMinor: givenBack.givenBackMinor,
        });
        return { kind: "given-back", paymentFor: what, paymentId: dep.id, refundedMinor: givenBack.givenBackMinor, whole: givenBack.whole };
      }
      return applyRefund(trx, dep, event, audit);
    }
    if (dep.status === "refunded") {
      // money given back stays given back: a late or resent success does not make it paid again
      await audit("paid", "refused", { eventId: event.id }, "the payment was refunded");
      return { kind: "ignored", reason: `the ${what} was refunded` } as const;
    }
    if (event.amount !== dep.amount_minor || !sameCurrency(event.currency, dep)) {
      await audit("paid", "refused", { eventId: event.id }, "amount or currency does not match");
      return { kind: "ignored", reason: `amount or currency does not match the ${what}` } as const;
    }
    if (dep.status !== "paid" && (await paidOtherwise(trx, dep))) {
      // a card that failed and then went through after all, when the bill or the quote's deposit had
      // been paid (a bill: or was being paid) by another payment: one payment counts, so the job and
      // the bill count it once; this one is answered (not retried for ever), closed if it was still
      // open (were the one that counts given back later, a new payment is a new row), and listed
      // for the money to be given back
      const thing = what === "balance" ? "bill" : "deposit";
      await audit(
        "paid",
        "refused",
        { eventId: event.id, paymentIntentId: event.paymentIntentId },
        `taken after the ${thing} was paid by another payment: to be given back`,
      );
      await toGiveBack(`Taken after the ${thing} was paid by another payment.`);
      if (dep.status === "pending") await setPaymentStatus(trx, dep, "failed");
      return { kind: "ignored", reason: `the ${thing} is paid already by another payment` } as const;
    }
    const newlyPaid = dep.status !== "paid";
    if (newlyPaid) {
      await setPaymentStatus(trx, dep, "paid");
      // the money was taken; a job closed meanwhile (cancelled while the card was charged) starts no work on it
      const job = await trx.selectFrom("work_orders").select("status").where("id", "=", dep.work_order_id).executeTakeFirstOrThrow();
      const closed = isClosed(job.status);
      await audit(
        "paid",
        "accepted",
        { eventId: event.id, paymentIntentId: event.paymentIntentId, ...(closed ? { jobStatus: job.status } : {}) },
        closed ? `paid after the job was closed (${STATUS_LABELS[job.status].toLowerCase()}): to be given back` : undefined,
      );
      if (closed) await toGiveBack(`Paid after the job was closed (${STATUS_LABELS[job.status].toLowerCase()}).`);
    }
    // newlyPaid: this event is the one that paid it (the row is locked, so of two events about one
    // payment arriving together exactly one sees it unpaid): only then is the customer e-mailed.
    const paid = {
      kind: "paid",
      paymentFor: what,
      paymentId: dep.id,
      shopId: dep.shop_id,
      workOrderId: dep.work_order_id,
      amountMinor: dep.amount_minor,
      newlyPaid,
    } as const;
    if (newlyPaid && onNewlyPaid) await onNewlyPaid(trx, paid);
    return paid;
  });
}

/** A deposit as every reader sees it (the quote's list, the customer's payment check). */
export const DEPOSIT_COLUMNS = [
  "id",
  "status",
  "amount_minor as amountMinor",
  "currency",
  "paid_at as paidAt",
  "payment_intent_id as paymentIntentId",
  "refunded_minor as refundedMinor",
] as const;

export async function depositForCustomer(db: Kysely<Database>, user: { shopId: string; customerId: string | null }, depositId: string) {
  return db
    .selectFrom("deposits as d")
    .innerJoin("work_orders as w", "w.id", "d.work_order_id")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .select(DEPOSIT_COLUMNS.map((c) => `d.${c}` as const))
    .where("d.id", "=", depositId)
    .where("d.shop_id", "=", user.shopId)
    .where("b.customer_id", "=", user.customerId ?? "00000000-0000-0000-0000-000000000000")
    .executeTakeFirst();
}
