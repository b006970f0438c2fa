import "server-only";
import { setRemindersAtHandover } from "../aftercare/reminders";
import type { Kysely, Transaction } from "kysely";
import { Refusal } from "@/lib/errors";
import type { OverrideRequest } from "@/lib/work-orders/transition-rules";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";
import { MoveRefusal, moveWorkOrder } from "../shop/work-orders";

export interface HandoverOptions<R> {
  note?: string;
  override?: OverrideRequest | null;
  /** Stores the build report as handed over, inside the handover's transaction (it sees the move). */
  storeReport: (trx: Transaction<Database>) => Promise<R>;
}

// Handover: the move to "handed over" (gated on the record, see moveWorkOrder), the final invoice
// and the stored copy of the build report, together or not at all. A refused move is written to
// the audit log after the rollback.
export async function handOver<R>(db: Kysely<Database>, shopId: string, userId: string, workOrderId: string, opts: HandoverOptions<R>) {
  try {
    return await db.transaction().execute(async (trx) => {
      const moved = await moveWorkOrder(trx, shopId, userId, workOrderId, "handed_over", { note: opts.note, override: opts.override });
      const invoice = await createFinalInvoice(trx, shopId, userId, workOrderId);
      const report = await opts.storeReport(trx);
      const reminders = await setRemindersAtHandover(trx, shopId, userId, workOrderId);
      return { ...moved, invoice, report, reminders };
    });
  } catch (e) {
    if (e instanceof MoveRefusal) await appendAudit(db, e.audit);
    throw e;
  }
}

// The final invoice at handover: the approved quote's totals less the deposits paid. One per job.
async function createFinalInvoice(trx: Kysely<Database> | Transaction<Database>, shopId: string, userId: string, workOrderId: string) {
  const existing = await trx.selectFrom("invoices").selectAll().where("work_order_id", "=", workOrderId).executeTakeFirst();
  if (existing) return existing;
  const q = await trx
    .selectFrom("quotes")
    .selectAll()
    .where("work_order_id", "=", workOrderId)
    .where("shop_id", "=", shopId)
    .where("status", "=", "approved")
    .orderBy("version", "desc")
    .executeTakeFirst();
  if (!q) throw new Refusal("There is no approved quote to invoice.", 409);
  const paid = await trx
    .selectFrom("deposits")
    .select((eb) => eb.fn.coalesce(eb.fn.sum<number>("amount_minor"), eb.lit(0)).as("s"))
    .where("quote_id", "=", q.id)
    .where("status", "=", "paid")
    .executeTakeFirstOrThrow();
  const last = await trx
    .selectFrom("invoices")
    .select((eb) => eb.fn.max("number").as("n"))
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
  const depositsPaid = Number(paid.s);
  return trx
    .insertInto("invoices")
    .values({
      shop_id: shopId,
      work_order_id: workOrderId,
      quote_id: q.id,
      number: (last?.n ?? 5000) + 1,
      currency: q.currency,
      subtotal_minor: q.subtotal_minor,
      tax_minor: q.tax_minor,
      total_minor: q.total_minor,
      deposits_paid_minor: depositsPaid,
      balance_due_minor: q.total_minor - depositsPaid,
      created_by: userId,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

const INVOICE_COLUMNS = [
  "number",
  "currency",
  "subtotal_minor as subtotalMinor",
  "tax_minor as taxMinor",
  "total_minor as totalMinor",
  "deposits_paid_minor as depositsPaidMinor",
  "balance_due_minor as balanceDueMinor",
] as const;

export async function invoiceOf(db: Kysely<Database>, shopId: string, workOrderId: string) {
  return db
    .selectFrom("invoices")
    .select(INVOICE_COLUMNS)
    .where("work_order_id", "=", workOrderId)
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
}
