import "server-only";
import { setRemindersAtHandover } from "../aftercare/reminders";
import type { Kysely, Transaction } from "kysely";
import type { OverrideRequest } from "@/lib/work-orders/transition-rules";
import { appendAudit } from "../audit/append";
import { issueBillIn } from "./final-bill";
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

// The final bill at handover: the one the office issued, else one issued now by the standing rules
// (labour as quoted, no fitted part added: db/office/final-bill.ts). One per job.
async function createFinalInvoice(trx: Transaction<Database>, shopId: string, userId: string, workOrderId: string) {
  return issueBillIn(trx, shopId, userId, workOrderId, {}, { refuseIfIssued: false });
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
