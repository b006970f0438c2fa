import { route } from "@/app/_server/route";
import { getJobSnapshot } from "@/db/bench/jobs";
import { Refusal } from "@/lib/errors";
import { isUuid } from "@/lib/ids";

// GET /api/bench/jobs/[id]: a full snapshot of one job for the tablet's store.
export const GET = route({ access: { area: "bench" }, params: ["id"] }, async ({ user, params, db }) => {
  if (!isUuid(params.id)) throw new Refusal(`"${params.id}" is not a work order id (a UUID).`, 400);
  const snapshot = await getJobSnapshot(db, user, params.id);
  if (!snapshot) throw new Refusal(`No work order ${params.id} in this shop.`, 404);
  return snapshot;
});
