import { deliverReviewNotices } from "@/app/_server/review-mail";
import { route } from "@/app/_server/route";
import { pageReviewQueue } from "@/db/review/queue";
import { queueQuerySchema } from "@/lib/review/list-queries";

// GET: one page of sign-offs waiting for review (q = bike, job, mechanic, outOfTolerance, sort, dir, page, size).
// Also sends any supervisor e-mail still waiting (a send that failed after an earlier sync).
export const GET = route({ access: { area: "review" }, query: queueQuerySchema }, async ({ user, query, db, later }) => {
  const { rows, total } = await pageReviewQueue(db, user.shopId, query);
  later(() => deliverReviewNotices(db).catch((e) => console.error("[review] notice e-mail run failed", e)));
  return { signOffs: rows, total, page: query.page, size: query.size };
});
