import { NextResponse } from "next/server";
import { guarded, idFrom, readJson } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { saveQuoteDraft } from "@/db/office/quotes";
import { quoteDraftSchema } from "@/lib/office/schemas";

// Saves the draft quote (lines, deposit, note); the totals are worked out on the server.
export const PUT = guarded<{ id: string }>("office", async ({ req, user, params }) => {
  const body = await readJson(req, quoteDraftSchema);
  return NextResponse.json(await saveQuoteDraft(db(), user.shopId, user.id, idFrom(params.id), body));
});
