import { idParam, route } from "@/app/_server/route";
import { loadBuildProgress } from "@/db/records/build-progress";
import { Refusal } from "@/lib/errors";

// The build's progress by stage (steps done, sign-offs, review decisions, readings out of tolerance).
export const GET = route({ access: { area: "office" }, params: ["id"] }, async ({ user, params, db }) => {
  const progress = await loadBuildProgress(db, user, idParam(params.id));
  if (!progress) throw new Refusal("No such work order in this shop.", 404);
  return progress;
});
