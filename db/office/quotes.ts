import "server-only";
import type { Kysely, Transaction } from "kysely";
import { quoteTotals } from "@/lib/money/quote-totals";
import { quoteDraftSchema, type QuoteDraftInput } from "@/lib/office/schemas";
import { Refusal } from "@/lib/errors";
import { isQuotable } from "@/lib/work-orders/status";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";
import { lockWorkOrder, moveWorkOrder } from "../shop/work-orders";
import { DEPOSIT_COLUMNS } from "./deposits";
import { pricedLineRow } from "./price-lines";

// Saves the office's draft quote for a work order: replaces the open draft's lines, or starts a
// new version (a sent quote is never edited; revising one supersedes it when the new one is sent).
export async function saveQuoteDraft(db: Kysely<Database>, shopId: string, userId: string, workOrderId: string, input: QuoteDraftInput) {
  const d = quoteDraftSchema.parse(input);
  return db.transaction().execute(async (trx) => {
    const wo = await lockWorkOrder(trx, shopId, workOrderId);
    if (!isQuotable(wo.status)) throw new Refusal("A quote can be written only before the customer approves one.", 409);
    const shop = await trx.selectFrom("shops").select(["tax_rate_bp", "currency"]).where("id", "=", shopId).executeTakeFirstOrThrow();
    const totals = quoteTotals(d.lines, shop.tax_rate_bp);
    if (d.depositMinor > totals.totalMinor) {
      throw new Refusal("The deposit cannot be more than the quote total.", 422, [
        { path: "depositMinor", message: "more than the total" },
      ]);
    }
    let draft = await trx
      .selectFrom("quotes")
      .select(["id", "version"])
      .where("work_order_id", "=", workOrderId)
      .where("status", "=", "draft")
      .executeTakeFirst();
    if (!draft) {
      const last = await trx
        .selectFrom("quotes")
        .select((eb) => eb.fn.max("version").as("v"))
        .where("work_order_id", "=", workOrderId)
        .executeTakeFirst();
      draft = await trx
        .insertInto("quotes")
        .values({
          shop_id: shopId,
          work_order_id: workOrderId,
          version: (last?.v ?? 0) + 1,
          status: "draft",
          currency: shop.currency,
          tax_rate_bp: shop.tax_rate_bp,
          created_by: userId,
          sent_at: null,
          approved_at: null,
          approved_by: null,
        })
        .returning(["id", "version"])
        .executeTakeFirstOrThrow();
    }
    await trx.deleteFrom("quote_lines").where("quote_id", "=", draft.id).execute();
    await trx
      .insertInto("quote_lines")
      .values(d.lines.map((l, i) => ({ quote_id: draft.id, ...pricedLineRow(l, i, totals.lineTotals[i]) })))
      .execute();
    await trx
      .updateTable("quotes")
      .set({
        tax_rate_bp: shop.tax_rate_bp,
        currency: shop.currency,
        subtotal_minor: totals.subtotalMinor,
        tax_minor: totals.taxMinor,
        total_minor: totals.totalMinor,
        deposit_minor: d.depositMinor,
        note: d.note,
      })
      .where("id", "=", draft.id)
      .execute();
    return { quoteId: draft.id, version: draft.version, ...totals };
  });
}

// Sends the draft: it becomes the customer's quote, an earlier sent one is superseded, and the
// work order moves to "quoted" (from booked in / inspected; it stays quoted on a revision).
export async function sendQuote(db: Kysely<Database>, shopId: string, userId: string, workOrderId: string) {
  return db.transaction().execute(async (trx) => {
    // the job first (a customer approving the sent quote at this moment is seen, or waits for this)
    const wo = await lockWorkOrder(trx, shopId, workOrderId);
    const draft = await trx
      .selectFrom("quotes")
      .select(["id", "version"])
      .where("work_order_id", "=", workOrderId)
      .where("shop_id", "=", shopId)
      .where("status", "=", "draft")
      .forUpdate()
      .executeTakeFirst();
    if (!draft) throw new Refusal("There is no draft quote to send.", 409);
    if (!isQuotable(wo.status))
      throw new Refusal(
        "The customer has approved a quote already (the job has moved on): this draft cannot be sent. Agree any change with the customer as extra work.",
        409,
      );
    if (wo.status === "booked_in")
      throw new Refusal("Record the inspection first: move the work order to Inspected, then send the quote.", 409);
    await trx
      .updateTable("quotes")
      .set({ status: "superseded" })
      .where("work_order_id", "=", workOrderId)
      .where("status", "=", "sent")
      .execute();
    await trx.updateTable("quotes").set({ status: "sent", sent_at: new Date() }).where("id", "=", draft.id).execute();
    if (wo.status !== "quoted") await moveWorkOrder(trx, shopId, userId, workOrderId, "quoted", { note: `quote v${draft.version} sent` });
    await appendAudit(trx, [
      { shopId, actorId: userId, action: "quote.send", entity: "quote", entityId: draft.id, workOrderId, outcome: "accepted" },
    ]);
    return { quoteId: draft.id };
  });
}

/** A quote with the customer who owns its bike, locked for the customer's answer. */
// Locks are taken job first, then its quotes, everywhere (saving and sending a draft, the
// customer's answer): two of them at once wait for each other instead of deadlocking, and each sees
// what the other did.
async function lockQuoteWithOwner(trx: Transaction<Database>, quoteId: string) {
  const of = await trx.selectFrom("quotes").select(["shop_id", "work_order_id"]).where("id", "=", quoteId).executeTakeFirst();
  if (!of) return undefined;
  await lockWorkOrder(trx, of.shop_id, of.work_order_id);
  return trx
    .selectFrom("quotes as q")
    .innerJoin("work_orders as w", "w.id", "q.work_order_id")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .select(["q.id", "q.status", "q.work_order_id as workOrderId", "b.customer_id as customerId", "q.shop_id as shopId"])
    .where("q.id", "=", quoteId)
    .forUpdate("q")
    .executeTakeFirst();
}

// The customer's approval from their own sign-in. Refused unless the quote is on a bike they own.
export async function approveQuoteAsCustomer(
  db: Kysely<Database>,
  user: { id: string; shopId: string; customerId: string | null },
  quoteId: string,
) {
  return db.transaction().execute(async (trx) => {
    const q = await lockQuoteWithOwner(trx, quoteId);
    if (!q || q.shopId !== user.shopId || !user.customerId || q.customerId !== user.customerId) {
      await appendAudit(db, [
        {
          shopId: user.shopId,
          actorId: user.id,
          action: "quote.approve",
          entity: "quote",
          entityId: quoteId,
          outcome: "refused",
          reason: "not this customer's quote",
        },
      ]);
      throw new Refusal("This quote is not yours to approve.", 403);
    }
    if (q.status === "approved") throw new Refusal("You have already approved this quote.", 409);
    if (q.status !== "sent") throw new Refusal("This quote has been replaced by a newer one; please look at the latest.", 409);
    if (await declineOf(trx, quoteId)) throw new Refusal("You declined this quote; the workshop will send you a new one.", 409);
    await trx
      .updateTable("quotes")
      .set({ status: "approved", approved_at: new Date(), approved_by: user.id })
      .where("id", "=", quoteId)
      .execute();
    await moveWorkOrder(trx, user.shopId, user.id, q.workOrderId, "approved", {
      byCustomerApproval: true,
      note: "customer approved the quote",
    });
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "quote.approve",
        entity: "quote",
        entityId: quoteId,
        workOrderId: q.workOrderId,
        outcome: "accepted",
      },
    ]);
    return { workOrderId: q.workOrderId };
  });
}

const declineOf = (db: Kysely<Database>, quoteId: string) =>
  db.selectFrom("quote_declines").select(["comment", "declined_at as at"]).where("quote_id", "=", quoteId).executeTakeFirst();

// The customer's "no" to a sent quote, with an optional comment: recorded once (append-only), the
// quote stays on file as sent and declined, the work order stays quoted, and the office may write
// a new version. Refused unless the quote is on a bike they own and still waits for an answer.
export async function declineQuoteAsCustomer(
  db: Kysely<Database>,
  user: { id: string; shopId: string; customerId: string | null },
  quoteId: string,
  comment: string,
) {
  return db.transaction().execute(async (trx) => {
    const q = await lockQuoteWithOwner(trx, quoteId);
    if (!q || q.shopId !== user.shopId || !user.customerId || q.customerId !== user.customerId)
      throw new Refusal("This quote is not yours to decline.", 403);
    if (q.status === "approved") throw new Refusal("You have already approved this quote; ask the workshop to change it.", 409);
    if (q.status !== "sent") throw new Refusal("This quote has been replaced by a newer one; please look at the latest.", 409);
    if (await declineOf(trx, quoteId)) throw new Refusal("You have already declined this quote.", 409);
    await trx.insertInto("quote_declines").values({ quote_id: quoteId, declined_by: user.id, comment }).execute();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "quote.decline",
        entity: "quote",
        entityId: quoteId,
        workOrderId: q.workOrderId,
        outcome: "accepted",
      },
    ]);
    return { workOrderId: q.workOrderId };
  });
}

// A quote as every reader sees it (office, customer, e-mails): one shape, camelCase, amounts in minor units.
const QUOTE_COLUMNS = [
  "id",
  "version",
  "status",
  "currency",
  "tax_rate_bp as taxRateBp",
  "subtotal_minor as subtotalMinor",
  "tax_minor as taxMinor",
  "total_minor as totalMinor",
  "deposit_minor as depositMinor",
  "note",
  "sent_at as sentAt",
  "approved_at as approvedAt",
] as const;
const LINE_COLUMNS = [
  "id",
  "position",
  "kind",
  "description",
  "part_number as partNumber",
  "quantity_hundredths as quantityHundredths",
  "unit_price_minor as unitPriceMinor",
  "line_total_minor as lineTotalMinor",
] as const;

export async function quoteWithLines(db: Kysely<Database>, shopId: string, quoteId: string) {
  const q = await db.selectFrom("quotes").select(QUOTE_COLUMNS).where("id", "=", quoteId).where("shop_id", "=", shopId).executeTakeFirst();
  if (!q) return null;
  const lines = await db.selectFrom("quote_lines").select(LINE_COLUMNS).where("quote_id", "=", quoteId).orderBy("position").execute();
  const deposits = await db.selectFrom("deposits").select(DEPOSIT_COLUMNS).where("quote_id", "=", quoteId).orderBy("created_at").execute();
  const declined = (await declineOf(db, quoteId)) ?? null;
  return { ...q, lines, deposits, declined };
}

// The quotes of a work order, newest first, each with lines and deposits.
export async function quotesOfWorkOrder(db: Kysely<Database>, shopId: string, workOrderId: string) {
  const ids = await db
    .selectFrom("quotes")
    .select("id")
    .where("work_order_id", "=", workOrderId)
    .where("shop_id", "=", shopId)
    .orderBy("version", "desc")
    .execute();
  const out = [];
  for (const { id } of ids) out.push((await quoteWithLines(db, shopId, id))!);
  return out;
}

// For the customer's own page: their work orders' quotes (sent, approved; never drafts).
export async function quotesForCustomer(db: Kysely<Database>, shopId: string, customerId: string) {
  const ids = await db
    .selectFrom("quotes as q")
    .innerJoin("work_orders as w", "w.id", "q.work_order_id")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .select(["q.id", "w.id as workOrderId"])
    .where("q.shop_id", "=", shopId)
    .where("b.customer_id", "=", customerId)
    .where("q.status", "in", ["sent", "approved"])
    .orderBy("q.version", "desc")
    .execute();
  const out = [];
  for (const { id, workOrderId } of ids) out.push({ workOrderId, ...(await quoteWithLines(db, shopId, id))! });
  return out;
}

/** A quote the customer sees on their own page, with the work order it is for. */
export type CustomerQuoteView = Awaited<ReturnType<typeof quotesForCustomer>>[number];
