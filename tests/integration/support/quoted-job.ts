import type { Kysely } from "kysely";
import type { Database } from "@/db/schema";
import type { WorkOrderStatus } from "@/lib/work-orders/status";
import type { ShopFixture } from "./shop-fixture";

// A work order of the fixture shop with an approved quote (version 1), written as the office's
// screens leave it; the quote's lines are the test's own. Used by the money tests.

export interface QuotedJobOptions {
  number: number;
  title: string;
  status: WorkOrderStatus;
  taxRateBp?: number;
  odometerKm?: number;
  mechanicId?: string | null;
  approvedBy?: string | null;
}

export async function insertQuotedJob(db: Kysely<Database>, fx: ShopFixture, o: QuotedJobOptions) {
  const wo = await db
    .insertInto("work_orders")
    .values({
      shop_id: fx.shopId,
      bike_id: fx.bike.id,
      number: o.number,
      title: o.title,
      status: o.status,
      intake_odometer_km: o.odometerKm ?? 1,
      assigned_mechanic_id: o.mechanicId ?? null,
      closed_at: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  const quote = await db
    .insertInto("quotes")
    .values({
      shop_id: fx.shopId,
      work_order_id: wo.id,
      version: 1,
      status: "approved",
      currency: "GBP",
      tax_rate_bp: o.taxRateBp ?? 2000,
      created_by: fx.users.office.id,
      sent_at: new Date(),
      approved_at: new Date(),
      approved_by: o.approvedBy ?? null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return { workOrderId: wo.id, quoteId: quote.id };
}
