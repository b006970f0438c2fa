import "server-only";
import { renderHandoverReportPdf } from "./handover-report";
import type { Db } from "@/db/setup/client";

// The PDF attached to the "bike ready" e-mail: the full handover build report.
export async function bikeReadyAttachment(db: Db, shopId: string, workOrderId: string): Promise<Buffer> {
  return renderHandoverReportPdf(db, shopId, workOrderId);
}
