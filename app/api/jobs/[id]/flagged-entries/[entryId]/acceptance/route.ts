import { reviseAfterAcceptedChange } from "@/app/_server/frozen-report";
import { created, idParam, json, route } from "@/app/_server/route";
import { acceptEntryOnItsOwn } from "@/db/review/entry-acceptance";
import { Refusal } from "@/lib/errors";
import { entryAcceptanceSchema } from "@/lib/review/decision-input";

// POST: accept one flagged entry of a closed job on its own ({ justification }), when no sign-off
// can carry it (db/review/entry-acceptance.ts). 201, with the build report's new revision when it
// makes one · 400 bad body · 403 role · 404 not in this shop · 409 job still open, a sign-off
// carries it, or accepted/withdrawn meanwhile · 422 your own entry. Audited, refusals too.
export const POST = route(
  { access: { area: "decide" }, params: ["id", "entryId"], body: json(entryAcceptanceSchema) },
  async ({ user, params, body, db }) => {
    const workOrderId = idParam(params.id);
    const result = await acceptEntryOnItsOwn(db, user, workOrderId, idParam(params.entryId), body.justification);
    if (!result.ok) throw new Refusal(result.reason, result.status, result.issues);
    const reportRevision = await reviseAfterAcceptedChange(db, user.shopId, workOrderId, user.id);
    return created({ acceptanceId: result.acceptanceId, reportRevision });
  },
);
