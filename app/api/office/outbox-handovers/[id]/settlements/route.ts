import { created, idParam, json, route } from "@/app/_server/route";
import { settleHandover } from "@/db/auth/outbox-handovers";
import { handoverSettlementSchema } from "@/lib/auth/session-schemas";

// POST: the office settles the work a tablet handed over on one job ({ workOrderId, note }):
// what was re-entered on the record, or why nothing needs to be. It closes that job's open item
// (the gates to "ready" and "handed over"). 201 · 400 bad body · 404 no entries on that job in
// this hand-over · 409 settled already. Audited, refusals too.
export const POST = route(
  { access: { area: "users" }, params: ["id"], body: json(handoverSettlementSchema) },
  async ({ user, params, body, db }) => created(await settleHandover(db, user, idParam(params.id), body)),
);
