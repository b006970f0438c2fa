import { NextResponse } from "next/server";
import { guarded } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { countReviewQueue } from "@/db/review/queue";

// GET: how many sign-offs wait for review in the user's shop (for the navigation).
export const GET = guarded("review", async ({ user }) => {
  return NextResponse.json({ waiting: await countReviewQueue(db(), user.shopId) }, { headers: { "cache-control": "no-store" } });
});
