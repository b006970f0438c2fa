"use client";

import { formatDayTime } from "@/lib/format/dates";
import type { WorkOrderData } from "./types";

/**
 * The build report: before handover, made from the record as it stands; from handover on, the
 * stored copies — revision 1 as handed over, then one per later accepted change — each with its
 * SHA-256 (the customer's link serves these very bytes).
 */
export function ReportCopies({ data }: { data: WorkOrderData }) {
  const wo = data.workOrder;
  const url = `/api/jobs/${wo.id}/build-report`;
  return (
    <section className="rounded-xl border-2 border-steel-300 bg-white p-4" aria-labelledby="report-heading" data-testid="report-copies">
      <h2 id="report-heading" className="text-2xl font-bold">
        Build report
      </h2>
      {data.reports.length === 0 ? (
        <p className="mt-1 text-lg">
          <a href={url} download className="underline" data-testid="report-download">
            Download the build report (PDF)
          </a>{" "}
          — made from the record as it stands now; a copy is stored for good when the bike is handed over.
        </p>
      ) : (
        <ol className="mt-2 space-y-2">
          {data.reports.map((r) => (
            <li key={r.revision} className="text-lg" data-testid="report-copy">
              <a href={`${url}?revision=${r.revision}`} download className="font-bold underline">
                Revision {r.revision}
              </a>{" "}
              {r.handedOver ? "✔ as handed over" : "after an accepted change"}, {formatDayTime(r.madeAt)}
              {r.madeByName ? ` by ${r.madeByName}` : ""}
              <span className="block break-all font-mono text-sm text-steel-700">SHA-256 {r.sha256}</span>
              {r.changes.length > 0 && (
                <ul className="ml-5 list-disc text-base">
                  {r.changes.map((c, i) => (
                    <li key={i}>{c}</li>
                  ))}
                </ul>
              )}
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
