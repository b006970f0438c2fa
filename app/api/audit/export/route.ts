import { auditCsvResponse } from "@/app/_server/audit-csv-response";
import { guarded } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { auditFilterSchema } from "@/lib/review/list-queries";

// GET: the shop's audit log as CSV (same filters as the page: job, outcome, action, q; no paging),
// streamed oldest first. Columns: README.md "Audit log CSV".
export const GET = guarded("audit", async ({ req, user }) => {
  const f = auditFilterSchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return auditCsvResponse(db(), user.shopId, f);
});
