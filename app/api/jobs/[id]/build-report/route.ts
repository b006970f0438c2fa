import { NextResponse } from "next/server";
import { renderHandoverReportPdf } from "@/app/_server/handover-report";
import { route } from "@/app/_server/route";
import { reportWorkOrderFor } from "@/db/records/handover-report";
import { Refusal } from "@/lib/errors";
import { isUuid } from "@/lib/ids";

// The handover build report as a PDF download: office and supervisors for their shop's work
// orders, customers for their own bikes only. Anyone else gets 401/403/404 and no data.
export const GET = route({ access: { area: "build-report" }, params: ["id"] }, async ({ user, params, db }) => {
  const job = isUuid(params.id) ? await reportWorkOrderFor(db, user, params.id) : null;
  if (!job) throw new Refusal("No such work order for you.", 404);
  const pdf = await renderHandoverReportPdf(db, user.shopId, job.id);
  return new NextResponse(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="build-report-${job.tagCode}-${job.number}.pdf"`,
      "cache-control": "private, no-store",
    },
  });
});
