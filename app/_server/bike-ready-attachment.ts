import type { Kysely } from "kysely";
import type { Database } from "@/db/schema";
import { renderHandoverReportPdf } from "./handover-report";

// The PDF attached to the "bike ready" e-mail: the full handover build report.
export async function bikeReadyAttachment(db: Kysely<Database>, shopId: string, workOrderId: string): Promise<Buffer> {
  return renderHandoverReportPdf(db, shopId, workOrderId);
}
