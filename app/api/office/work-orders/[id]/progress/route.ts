import { NextResponse } from "next/server";
import { guarded, idFrom } from "@/app/_server/route-helpers";
import { loadBuildProgress } from "@/db/records/build-progress";
import { db } from "@/db/setup/client";
import { Refusal } from "@/lib/office/refusal";

// The build's progress by stage (steps done, sign-offs, review decisions, readings out of tolerance).
export const GET = guarded<{ id: string }>("office", async ({ user, params }) => {
  const progress = await loadBuildProgress(db(), user, idFrom(params.id));
  if (!progress) throw new Refusal("No such work order in this shop.", 404);
  return NextResponse.json(progress);
});
