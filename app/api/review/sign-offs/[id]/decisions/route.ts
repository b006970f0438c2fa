import { reviseAfterAcceptedChange } from "@/app/_server/frozen-report";
import { created, idParam, json, route } from "@/app/_server/route";
import { decideOnSignOff } from "@/db/review/decide";
import { Refusal } from "@/lib/errors";
import { decisionRequestSchema } from "@/lib/review/decision-input";

// POST: approve or send back a sign-off (body: lib/review/decision-input.ts). 201 with the decision;
// 400 bad body (issues per field) · 403 role or own sign-off · 404 not in this shop ·
// 409 newer sign-off, someone decided meanwhile, work on the stage arrived after the screen's `seenUpTo`, or closed job · 422 rules (issues per reading, entry or step).
// A decision on a handed-over job is an accepted change: the stored build report gets a new
// revision (if storing fails, the next read of the report makes it; the decision stands either way).
export const POST = route(
  { access: { area: "decide" }, params: ["id"], body: json(decisionRequestSchema) },
  async ({ user, params, body, db }) => {
    const result = await decideOnSignOff(db, user, idParam(params.id), body);
    if (!result.ok) throw new Refusal(result.reason, result.status, result.issues);
    const reportRevision = result.closedJob ? await reviseAfterAcceptedChange(db, user.shopId, result.workOrderId, user.id) : null;
    return created({ ...result, reportRevision });
  },
);
