import "server-only";
import { auditLogBatches } from "@/db/audit/read";
import { auditCsvChunk } from "@/lib/review/audit-csv";
import type { AuditExport } from "@/lib/review/audit-range";
import type { Db } from "@/db/setup/client";

/** The shop's audit log within a date range as a streamed CSV download, oldest entry first, 500 rows per database read. */
export function auditCsvResponse(db: Db, shopId: string, { filter: f, range }: AuditExport): Response {
  const encoder = new TextEncoder();
  const batches = auditLogBatches(db, shopId, f, range);
  let header = true;
  const stream = new ReadableStream<Uint8Array>({
    async pull(controller) {
      try {
        const next = await batches.next();
        if (next.done) {
          if (header) controller.enqueue(encoder.encode(auditCsvChunk([], true)));
          controller.close();
          return;
        }
        controller.enqueue(encoder.encode(auditCsvChunk(next.value, header)));
        header = false;
      } catch (e) {
        console.error("[audit] export failed", e);
        controller.error(e);
      }
    },
    async cancel() {
      await batches.return(undefined);
    },
  });
  const name = `audit-log-${f.job !== undefined ? `job-${f.job}` : "all"}-${range.fromDay}-to-${range.toDay}.csv`;
  return new Response(stream, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${name}"`,
      "cache-control": "no-store",
    },
  });
}
