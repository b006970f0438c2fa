import { auditCsvResponse } from "@/app/_server/audit-csv-response";
import { route } from "@/app/_server/route";
import { auditFilterSchema } from "@/lib/review/list-queries";

// GET: the shop's audit log as CSV (same filters as the page: job, outcome, action, q; no paging),
// streamed oldest first. Columns: README.md "Audit log CSV".
export const GET = route({ access: { area: "audit" }, query: auditFilterSchema }, async ({ user, query, db }) =>
  auditCsvResponse(db, user.shopId, query),
);
