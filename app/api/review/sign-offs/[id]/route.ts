import { idParam, route } from "@/app/_server/route";
import { loadSignOffReview } from "@/db/review/detail";
import { Refusal } from "@/lib/errors";

// GET: everything the review screen shows for one sign-off of the user's shop.
export const GET = route({ access: { area: "review" }, params: ["id"] }, async ({ user, params, db }) => {
  const review = await loadSignOffReview(db, user, idParam(params.id));
  if (!review) throw new Refusal("No such sign-off in this shop.", 404);
  return review;
});
