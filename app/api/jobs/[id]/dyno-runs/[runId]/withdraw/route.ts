import { NextResponse } from "next/server";
import { guarded, idFrom, readJson } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { withdrawDynoRun } from "@/db/records/dyno";
import { runWithdrawalSchema } from "@/lib/dyno/run-withdrawal";
import { Refusal } from "@/lib/office/refusal";

// Withdraw a run recorded by mistake: body { reason }. Supervisors and the office only.
export const POST = guarded<{ id: string; runId: string }>("dyno-withdraw", async ({ req, user, params }) => {
  const workOrderId = idFrom(params.id);
  const runId = idFrom(params.runId);
  const input = await readJson(req, runWithdrawalSchema);
  const r = await withdrawDynoRun(db(), user, workOrderId, runId, input);
  if (!r.ok) throw new Refusal(r.reason, r.status);
  return NextResponse.json({ runId: r.runId, withdrawn: true });
});
