import type { Kysely } from "kysely";
import { quoteTotals } from "@/lib/money/quote-totals";
import type { Database } from "../schema";

// A demo job in build on one procedure, with its approved quote: the work order, its first
// transition, the pinned procedure, the quote at the shop's tax rate and its lines.

export interface DemoQuoteLine {
  kind: "labour" | "part";
  description: string;
  partNumber: string | null;
  /** Hundredths (350 = 3.50 h). */
  qty: number;
  /** Minor units. */
  price: number;
}

export interface DemoQuotedJob {
  shopId: string;
  bikeId: string;
  number: number;
  title: string;
  complaint: string;
  odometerKm: number;
  mechanicId: string;
  officeId: string;
  templateVersionId: string;
  lines: readonly DemoQuoteLine[];
  depositMinor: number;
}

export async function insertQuotedDemoJob(
  db: Kysely<Database>,
  j: DemoQuotedJob,
): Promise<{ workOrderId: string; quoteId: string; currency: string }> {
  const shop = await db.selectFrom("shops").select(["tax_rate_bp", "currency"]).where("id", "=", j.shopId).executeTakeFirstOrThrow();
  const totals = quoteTotals(
    j.lines.map((l) => ({ quantityHundredths: l.qty, unitPriceMinor: l.price })),
    shop.tax_rate_bp,
  );
  const wo = await db
    .insertInto("work_orders")
    .values({
      shop_id: j.shopId,
      bike_id: j.bikeId,
      number: j.number,
      title: j.title,
      status: "in_build",
      complaint: j.complaint,
      intake_odometer_km: j.odometerKm,
      assigned_mechanic_id: j.mechanicId,
      closed_at: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  await db
    .insertInto("work_order_transitions")
    .values({ work_order_id: wo.id, from_status: null, to_status: "in_build", by_user_id: j.officeId, note: "demo data" })
    .execute();
  await db.insertInto("job_procedures").values({ work_order_id: wo.id, template_version_id: j.templateVersionId, position: 0 }).execute();
  const quote = await db
    .insertInto("quotes")
    .values({
      shop_id: j.shopId,
      work_order_id: wo.id,
      version: 1,
      status: "approved",
      currency: shop.currency,
      tax_rate_bp: shop.tax_rate_bp,
      subtotal_minor: totals.subtotalMinor,
      tax_minor: totals.taxMinor,
      total_minor: totals.totalMinor,
      deposit_minor: j.depositMinor,
      created_by: j.officeId,
      sent_at: new Date(),
      approved_at: new Date(),
      approved_by: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  await db
    .insertInto("quote_lines")
    .values(
      j.lines.map((l, i) => ({
        quote_id: quote.id,
        position: i,
        kind: l.kind,
        description: l.description,
        part_number: l.partNumber,
        quantity_hundredths: l.qty,
        unit_price_minor: l.price,
        line_total_minor: totals.lineTotals[i],
      })),
    )
    .execute();
  return { workOrderId: wo.id, quoteId: quote.id, currency: shop.currency };
}
