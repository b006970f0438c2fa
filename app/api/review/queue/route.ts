import { route } from "@/app/_server/route";
import { pageReviewQueue } from "@/db/review/queue";
import { queueQuerySchema } from "@/lib/review/list-queries";

// GET: one page of sign-offs waiting for review (q = bike, job, mechanic, outOfTolerance, sort, dir, page, size).
// A read only: the supervisors' e-mails go out through the queue (app/_server/queue/), never from here.
export const GET = route({ access: { area: "review" }, query: queueQuerySchema }, async ({ user, query, db }) => {
  const { rows, total } = await pageReviewQueue(db, user.shopId, query);
  return { signOffs: rows, total, page: query.page, size: query.size };
});
