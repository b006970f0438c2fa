import { route } from "@/app/_server/route";
import { pageAuditLog } from "@/db/audit/read";
import { auditQuerySchema } from "@/lib/review/list-queries";

// GET: one page of the shop's audit log (job, outcome, action, q, sort, dir, page, size);
// `total` is counted up to 10,000, and `more` says there are more than that.
export const GET = route({ access: { area: "audit" }, query: auditQuerySchema }, async ({ user, query, db }) => {
  const { rows, total, more } = await pageAuditLog(db, user.shopId, query);
  return { entries: rows, total, more, page: query.page, size: query.size };
});
