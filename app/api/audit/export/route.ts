import { auditCsvResponse } from "@/app/_server/audit-csv-response";
import { route } from "@/app/_server/route";
import { auditExportSchema } from "@/lib/review/audit-range";

// GET: the shop's audit log as CSV (same filters as the page: job, outcome, action, q; no paging)
// for the days From to To (at most a year; lib/review/audit-range.ts), streamed oldest first.
// Columns: README.md "Audit log CSV".
export const GET = route({ access: { area: "audit" }, query: auditExportSchema() }, async ({ user, query, db }) =>
  auditCsvResponse(db, user.shopId, query),
);
