import { NextResponse } from "next/server";
import { parseWorkOrderId } from "@/app/_server/route-params";
import { requireApiArea } from "@/app/_server/session";
import { db } from "@/db/client";
import { withdrawDynoRun } from "@/db/dyno";
import { runWithdrawalSchema } from "@/lib/dyno/run-withdrawal";

type Params = { params: Promise<{ id: string; runId: string }> };

// Withdraw a run recorded by mistake: body { reason }. Supervisors and the office only.
export async function POST(req: Request, { params }: Params) {
  const auth = await requireApiArea("dyno-withdraw");
  if (auth.response) return auth.response;
  const p = await params;
  const workOrderId = parseWorkOrderId(p.id);
  const runId = parseWorkOrderId(p.runId);
  if (!workOrderId || !runId) return NextResponse.json({ error: "No such dyno run on this work order." }, { status: 404 });
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    return NextResponse.json({ error: "The request body must be JSON.", issues: [] }, { status: 400 });
  }
  const input = runWithdrawalSchema.safeParse(body);
  if (!input.success) {
    const issues = input.error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message }));
    return NextResponse.json({ error: issues[0]?.message ?? "Check the reason.", issues }, { status: 400 });
  }
  const r = await withdrawDynoRun(db(), auth.user, workOrderId, runId, input.data);
  if (!r.ok) return NextResponse.json({ error: r.reason, issues: [] }, { status: r.status });
  return NextResponse.json({ runId: r.runId, withdrawn: true });
}
