import { created, idParam, json, route } from "@/app/_server/route";
import { recordComeBackFinding } from "@/db/aftercare/come-backs";
import { comeBackFindingSchema } from "@/lib/aftercare/come-backs";

// POST /api/come-backs/[id]/findings: the office's or supervisor's finding (warranty and cause),
// append-only; a later one names the finding it replaces.
export const POST = route(
  { access: { area: "come-backs" }, params: ["id"], body: json(comeBackFindingSchema) },
  async ({ user, params, body, db }) => created(await recordComeBackFinding(db, user, idParam(params.id), body)),
);
