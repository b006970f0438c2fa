import { idParam, json, route } from "@/app/_server/route";
import { saveQuoteDraft } from "@/db/office/quotes";
import { quoteDraftSchema } from "@/lib/office/schemas";

// Saves the draft quote (lines, deposit, note); the totals are worked out on the server.
export const PUT = route({ access: { area: "office" }, params: ["id"], body: json(quoteDraftSchema) }, async ({ user, params, body, db }) =>
  saveQuoteDraft(db, user.shopId, user.id, idParam(params.id), body),
);
