import { z } from "zod";
import { route } from "@/app/_server/route";
import { handedOverJobOfBike } from "@/db/aftercare/come-backs";
import { findJobByTag } from "@/db/bench/jobs";
import { canReach } from "@/lib/auth/roles";
import { Refusal } from "@/lib/errors";

const tagCodeSchema = z
  .string()
  .trim()
  .min(1, "is empty")
  .max(64, "is longer than 64 characters")
  .regex(/^[\p{L}\p{N}._:/ -]+$/u, "may hold letters, digits, spaces and . _ : / - only");

// GET /api/bench/tags/[code]: the job open for bench work on the bike with this tag; for a bike
// whose last job was handed over, that job (and any come-back open for it), so the bench can offer
// a come-back (office and supervisors open one; a mechanic is told to ask).
export const GET = route({ access: { area: "bench" }, params: ["code"] }, async ({ user, params, db }) => {
  const tag = tagCodeSchema.safeParse(params.code);
  if (!tag.success) throw new Refusal(`The tag code ${tag.error.issues[0].message}.`, 400);
  const found = await findJobByTag(db, user, tag.data);
  if (found.found === "nothing") throw new Refusal(`No bike with tag ${tag.data} in this shop.`, 404);
  if (found.found === "bike-without-job") {
    const last = found.openElsewhere ? null : await handedOverJobOfBike(db, user.shopId, found.bikeId);
    if (!last) throw new Refusal(`Bike ${found.tagCode} has no open job.`, 404);
    return { handedOver: { ...last, tagCode: found.tagCode, canOpenComeBack: canReach(user.role, "come-backs") } };
  }
  return found.job;
});
