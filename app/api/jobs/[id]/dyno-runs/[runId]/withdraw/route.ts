import { idParam, json, route } from "@/app/_server/route";
import { withdrawDynoRun } from "@/db/records/dyno";
import { runWithdrawalSchema } from "@/lib/dyno/run-withdrawal";
import { Refusal } from "@/lib/errors";

// Withdraw a run recorded by mistake: body { reason }. Supervisors and the office only.
export const POST = route(
  { access: { area: "dyno-withdraw" }, params: ["id", "runId"], body: json(runWithdrawalSchema) },
  async ({ user, params, body, db }) => {
    const r = await withdrawDynoRun(db, user, idParam(params.id), idParam(params.runId), body);
    if (!r.ok) throw new Refusal(r.reason, r.status);
    return { runId: r.runId, withdrawn: true };
  },
);
