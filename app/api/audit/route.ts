import { NextResponse } from "next/server";
import { guarded } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { pageAuditLog } from "@/db/audit/read";
import { auditQuerySchema } from "@/lib/review/list-queries";

// GET: one page of the shop's audit log (job, outcome, action, q, sort, dir, page, size).
export const GET = guarded("audit", async ({ req, user }) => {
  const q = auditQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const { rows, total } = await pageAuditLog(db(), user.shopId, q);
  return NextResponse.json({ entries: rows, total, page: q.page, size: q.size }, { headers: { "cache-control": "no-store" } });
});
