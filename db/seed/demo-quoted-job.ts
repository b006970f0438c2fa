import type { Kysely } from "kysely";
import type { Database } from "../schema";
import { insertDemoQuote, type DemoQuoteLine } from "./demo-quote";

// A demo job in build on one procedure, with its approved quote: the work order, its first
// transition, the pinned procedure, the quote at the shop's tax rate and its lines.

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
  const { id: quoteId } = await insertDemoQuote(db, {
    shop: { id: j.shopId, ...shop },
    workOrderId: wo.id,
    status: "approved",
    lines: j.lines,
    depositMinor: j.depositMinor,
    createdBy: j.officeId,
    approvedBy: null,
  });
  return { workOrderId: wo.id, quoteId, currency: shop.currency };
}
