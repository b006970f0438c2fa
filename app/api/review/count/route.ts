import { route } from "@/app/_server/route";
import { countReviewQueue } from "@/db/review/queue";

// GET: how many sign-offs wait for review in the user's shop (for the navigation).
export const GET = route({ access: { area: "review" } }, async ({ user, db }) => ({ waiting: await countReviewQueue(db, user.shopId) }));
