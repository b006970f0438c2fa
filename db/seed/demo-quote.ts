import type { Kysely } from "kysely";
import { quoteTotals, type QuoteTotals } from "@/lib/money/quote-totals";
import { pricedLineRow } from "../office/price-lines";
import type { Database } from "../schema";

// One demo quote as the office would have saved and sent it: totals at the shop's tax rate, the
// quote, and its lines (written like the office's own, through pricedLineRow).

/** A demo quote line: quantity in hundredths (350 = 3.50 h), price in minor units. */
export interface DemoQuoteLine {
  kind: "labour" | "part";
  description: string;
  partNumber?: string | null;
  qty: number;
  price: number;
}

export interface DemoQuote {
  shop: { id: string; tax_rate_bp: number; currency: string };
  workOrderId: string;
  status: "sent" | "approved";
  lines: readonly DemoQuoteLine[];
  depositMinor: number;
  createdBy: string;
  /** Who approved it (an approved quote only); null when approved without a customer sign-in. */
  approvedBy: string | null;
}

/** Writes the quote and its lines; returns the quote's id and its totals. */
export async function insertDemoQuote(db: Kysely<Database>, q: DemoQuote): Promise<{ id: string; totals: QuoteTotals }> {
  const lines = q.lines.map((l) => ({
    kind: l.kind,
    description: l.description,
    partNumber: l.partNumber ?? null,
    quantityHundredths: l.qty,
    unitPriceMinor: l.price,
  }));
  const totals = quoteTotals(lines, q.shop.tax_rate_bp);
  const quote = await db
    .insertInto("quotes")
    .values({
      shop_id: q.shop.id,
      work_order_id: q.workOrderId,
      version: 1,
      status: q.status,
      currency: q.shop.currency,
      tax_rate_bp: q.shop.tax_rate_bp,
      subtotal_minor: totals.subtotalMinor,
      tax_minor: totals.taxMinor,
      total_minor: totals.totalMinor,
      deposit_minor: q.depositMinor,
      created_by: q.createdBy,
      sent_at: new Date(),
      approved_at: q.status === "approved" ? new Date() : null,
      approved_by: q.status === "approved" ? q.approvedBy : null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  await db
    .insertInto("quote_lines")
    .values(lines.map((l, i) => ({ quote_id: quote.id, ...pricedLineRow(l, i, totals.lineTotals[i]) })))
    .execute();
  return { id: quote.id, totals };
}
