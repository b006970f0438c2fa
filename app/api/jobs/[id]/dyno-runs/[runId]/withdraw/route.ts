import { reviseAfterAcceptedChange } from "@/app/_server/frozen-report";
import { idParam, json, route } from "@/app/_server/route";
import { withdrawDynoRun } from "@/db/records/dyno";
import { runWithdrawalSchema } from "@/lib/dyno/run-withdrawal";
import { Refusal } from "@/lib/errors";

// Withdraw a run recorded by mistake: body { reason }. Supervisors and the office only. On a
// handed-over job it is an accepted change: the stored build report gets a new revision (if
// storing fails, the next read of the report makes it; the withdrawal stands either way).
export const POST = route(
  { access: { area: "dyno-withdraw" }, params: ["id", "runId"], body: json(runWithdrawalSchema) },
  async ({ user, params, body, db }) => {
    const id = idParam(params.id);
    const r = await withdrawDynoRun(db, user, id, idParam(params.runId), body);
    if (!r.ok) throw new Refusal(r.reason, r.status);
    const reportRevision = r.closedJob ? await reviseAfterAcceptedChange(db, user.shopId, id, user.id) : null;
    return { runId: r.runId, withdrawn: true, reportRevision };
  },
);
