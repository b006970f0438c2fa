import "server-only";
import type { Kysely } from "kysely";
import { Refusal } from "@/lib/errors";
import type { Database } from "../schema";

// The customer pays the balance of their issued bill: a pending row the payment intent is tied to
// (a pending or paid one is reused, so a double click pays once); the signed webhook marks it paid
// (applyPaymentEvent in ./deposits.ts).

export async function openBalancePayment(db: Kysely<Database>, user: { shopId: string; customerId: string | null }, invoiceId: string) {
  return db.transaction().execute(async (trx) => {
    const inv = await trx
      .selectFrom("invoices as i")
      .innerJoin("work_orders as w", "w.id", "i.work_order_id")
      .innerJoin("bikes as b", "b.id", "w.bike_id")
      .select([
        "i.id",
        "i.shop_id as shopId",
        "i.work_order_id as workOrderId",
        "i.balance_due_minor as balance",
        "i.currency",
        "i.number",
        "b.customer_id as customerId",
      ])
      .where("i.id", "=", invoiceId)
      .forUpdate("i")
      .executeTakeFirst();
    if (!inv || inv.shopId !== user.shopId || !user.customerId || inv.customerId !== user.customerId)
      throw new Refusal("This bill is not yours.", 403);
    const balance = Number(inv.balance);
    if (balance <= 0) throw new Refusal("Nothing is left to pay on this bill.", 409);
    const existing = await trx
      .selectFrom("balance_payments")
      .selectAll()
      .where("invoice_id", "=", inv.id)
      .where("status", "in", ["pending", "paid"])
      .executeTakeFirst();
    if (existing?.status === "paid") throw new Refusal("The balance is already paid. Thank you.", 409);
    const payment =
      existing ??
      (await trx
        .insertInto("balance_payments")
        .values({
          shop_id: inv.shopId,
          work_order_id: inv.workOrderId,
          invoice_id: inv.id,
          amount_minor: balance,
          currency: inv.currency,
          status: "pending",
          payment_intent_id: null,
          paid_at: null,
        })
        .returningAll()
        .executeTakeFirstOrThrow());
    return { payment: { ...payment, amount_minor: Number(payment.amount_minor) }, invoiceNumber: inv.number };
  });
}

export async function attachBalanceIntent(db: Kysely<Database>, paymentId: string, paymentIntentId: string) {
  await db
    .updateTable("balance_payments")
    .set({ payment_intent_id: paymentIntentId })
    .where("id", "=", paymentId)
    .where("payment_intent_id", "is", null)
    .execute();
}

/** One balance payment of the customer's own bill (for the page waiting on the webhook). */
export async function balancePaymentForCustomer(db: Kysely<Database>, user: { shopId: string; customerId: string | null }, id: string) {
  return db
    .selectFrom("balance_payments as p")
    .innerJoin("work_orders as w", "w.id", "p.work_order_id")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .select(["p.id", "p.status", "p.amount_minor as amountMinor", "p.paid_at as paidAt"])
    .where("p.id", "=", id)
    .where("p.shop_id", "=", user.shopId)
    .where("b.customer_id", "=", user.customerId ?? "00000000-0000-0000-0000-000000000000")
    .executeTakeFirst();
}
