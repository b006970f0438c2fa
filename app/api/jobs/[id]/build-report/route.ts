import { NextResponse } from "next/server";
import { z } from "zod";
import { reviseStoredReport, storedReport } from "@/app/_server/frozen-report";
import { renderHandoverReportPdf } from "@/app/_server/handover-report";
import { route } from "@/app/_server/route";
import { reportWorkOrderFor } from "@/db/records/handover-report";
import { Refusal } from "@/lib/errors";
import { isUuid } from "@/lib/ids";

const query = z.object({
  revision: z.coerce
    .number("Revision: a whole number from 1.")
    .int("Revision: a whole number from 1.")
    .min(1, "Revision: a whole number from 1.")
    .max(1_000_000, "Revision: a whole number from 1.")
    .optional(),
});

// The build report as a PDF download: office and supervisors for their shop's work orders,
// customers for their own bikes only. Anyone else gets 401/403/404 and no data.
// Before handover it is made from the record as it stands. From handover on it is the stored
// copy, byte for byte: the latest revision, or `?revision=n` (1 is the one handed over); the
// answer names its revision and SHA-256 in headers.
export const GET = route({ access: { area: "build-report" }, params: ["id"], query }, async ({ user, params, query, db }) => {
  const job = isUuid(params.id) ? await reportWorkOrderFor(db, user, params.id) : null;
  if (!job) throw new Refusal("No such work order for you.", 404);
  const headers = (name: string) => ({
    "content-type": "application/pdf",
    "content-disposition": `attachment; filename="${name}"`,
    "cache-control": "private, no-store",
  });
  if (job.status !== "handed_over") {
    if (query.revision !== undefined) {
      throw new Refusal("This job has no stored report yet: the report is stored when the bike is handed over.", 404, [
        { path: "revision", message: "Revision: none stored before handover." },
      ]);
    }
    const pdf = await renderHandoverReportPdf(db, user.shopId, job.id);
    return new NextResponse(new Uint8Array(pdf), { headers: headers(`build-report-${job.tagCode}-${job.number}.pdf`) });
  }
  await reviseStoredReport(db, user.shopId, job.id, null);
  const stored = await storedReport(db, user.shopId, job.id, query.revision ?? null);
  if (!stored)
    throw new Refusal(`There is no revision ${query.revision} of this report.`, 404, [
      { path: "revision", message: "Revision: not on record." },
    ]);
  return new NextResponse(new Uint8Array(stored.bytes), {
    headers: {
      ...headers(`build-report-${job.tagCode}-${job.number}-revision-${stored.revision}.pdf`),
      "x-report-revision": String(stored.revision),
      "x-report-sha256": stored.sha256,
    },
  });
});
