import { idParam, route } from "@/app/_server/route";
import { hoursOfJob } from "@/db/bench/clocks";
import { Refusal } from "@/lib/errors";

// Time at the bench on a job: every clock span, hours per stage and per person, and the quoted
// labour (the approved quote, else the latest sent) to compare with. The office and review.
export const GET = route({ access: { anyArea: ["office", "review"] }, params: ["id"] }, async ({ user, params, db }) => {
  const hours = await hoursOfJob(db, user.shopId, idParam(params.id, "No such work order in this shop."));
  if (!hours) throw new Refusal("No such work order in this shop.", 404);
  return hours;
});
