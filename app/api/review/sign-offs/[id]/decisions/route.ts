import { NextResponse } from "next/server";
import { guarded, idFrom, readJson } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { decideOnSignOff } from "@/db/review/decide";
import { decisionInputSchema } from "@/lib/review/decision-input";

// POST: approve or send back a sign-off (body: lib/review/decision-input.ts). 201 with the decision;
// 400 bad body (issues per field) · 403 role or own sign-off · 404 not in this shop ·
// 409 newer sign-off, someone decided meanwhile, or closed job · 422 rules (issues per reading or step).
export const POST = guarded<{ id: string }>("decide", async ({ req, user, params }) => {
  const signOffId = idFrom(params.id);
  const input = await readJson(req, decisionInputSchema);
  const result = await decideOnSignOff(db(), user, signOffId, input);
  if (!result.ok) return NextResponse.json({ error: result.reason, issues: result.issues }, { status: result.status });
  return NextResponse.json(result, { status: 201 });
});
