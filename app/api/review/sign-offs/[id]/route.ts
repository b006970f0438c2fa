import { NextResponse } from "next/server";
import { guarded, idFrom } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { loadSignOffReview } from "@/db/review/detail";
import { Refusal } from "@/lib/office/refusal";

// GET: everything the review screen shows for one sign-off of the user's shop.
export const GET = guarded<{ id: string }>("review", async ({ user, params }) => {
  const review = await loadSignOffReview(db(), user, idFrom(params.id));
  if (!review) throw new Refusal("No such sign-off in this shop.", 404);
  return NextResponse.json(review, { headers: { "cache-control": "no-store" } });
});
