import { after, NextResponse } from "next/server";
import { deliverReviewNotices } from "@/app/_server/review-mail";
import { guarded } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { pageReviewQueue } from "@/db/review/queue";
import { queueQuerySchema } from "@/lib/review/list-queries";

// GET: one page of sign-offs waiting for review (q = bike, job, mechanic, outOfTolerance, sort, dir, page, size).
// Also sends any supervisor e-mail still waiting (a send that failed after an earlier sync).
export const GET = guarded("review", async ({ req, user }) => {
  const q = queueQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const { rows, total } = await pageReviewQueue(db(), user.shopId, q);
  after(() => deliverReviewNotices(db()).catch((e) => console.error("[review] notice e-mail run failed", e)));
  return NextResponse.json({ signOffs: rows, total, page: q.page, size: q.size }, { headers: { "cache-control": "no-store" } });
});
