import type { Kysely } from "kysely";
import type { Database } from "@/db/schema";
import { renderHandoverSummaryPdf } from "./handover-summary-pdf";

// The PDF attached to the "bike ready" e-mail. Swap to renderHandoverReportPdf from
// ./handover-report once that lands: same arguments, same result type.
export async function bikeReadyAttachment(db: Kysely<Database>, shopId: string, workOrderId: string): Promise<Buffer> {
  return renderHandoverSummaryPdf(db, shopId, workOrderId);
}
