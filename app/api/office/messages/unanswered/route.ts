import { route } from "@/app/_server/route";
import { unansweredThreads } from "@/db/customer-contact/messages";

// GET: the jobs whose newest message is the customer's, longest waiting first.
export const GET = route({ access: { area: "office" } }, async ({ user, db }) => ({ threads: await unansweredThreads(db, user.shopId) }));
