import { NextResponse } from "next/server";
import { renderHandoverReportPdf } from "@/app/_server/handover-report";
import { parseWorkOrderId } from "@/app/_server/route-params";
import { requireApiArea } from "@/app/_server/session";
import { db } from "@/db/setup/client";
import { reportWorkOrderFor } from "@/db/records/handover-report";

type Params = { params: Promise<{ id: string }> };

// The handover build report as a PDF download: office and supervisors for their shop's work
// orders, customers for their own bikes only. Anyone else gets 401/403/404 and no data.
export async function GET(_req: Request, { params }: Params) {
  const auth = await requireApiArea("build-report");
  if (auth.response) return auth.response;
  const id = parseWorkOrderId((await params).id);
  const visible = id ? await reportWorkOrderFor(db(), auth.user, id) : null;
  if (!visible) return NextResponse.json({ error: "No such work order for you." }, { status: 404 });
  const job = await db().selectFrom("work_orders as w").innerJoin("bikes as b", "b.id", "w.bike_id").select(["w.number", "b.tag_code"]).where("w.id", "=", visible).executeTakeFirstOrThrow();
  const pdf = await renderHandoverReportPdf(db(), auth.user.shopId, visible);
  return new NextResponse(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="build-report-${job.tag_code}-${job.number}.pdf"`,
      "cache-control": "private, no-store",
    },
  });
}
