import { z } from "zod";
import { created, idParam, json, MIB, route } from "@/app/_server/route";
import { listDynoRuns } from "@/db/records/dyno";
import { importDynoRun } from "@/db/records/dyno-import";
import { Refusal } from "@/lib/errors";

const NOT_FOUND = "No such work order in your shop.";

// The work order's runs (as recorded; the page computes the curves).
export const GET = route({ access: { area: "dyno" }, params: ["id"] }, async ({ user, params, db }) => ({
  runs: await listDynoRuns(db, user.shopId, idParam(params.id, NOT_FOUND)),
}));

// A new run: fields plus its curve (table rows or CSV text). All checked; stored all or nothing.
// The body is checked whole by importDynoRun (fields and every curve row at once), so the wrapper
// only reads it as JSON here.
export const POST = route(
  { access: { area: "dyno" }, params: ["id"], body: json(z.unknown(), { maxBytes: 2 * MIB }) },
  async ({ user, params, body, db }) => {
    const r = await importDynoRun(db, user.shopId, idParam(params.id, NOT_FOUND), user.id, body);
    if (r.ok) return created({ id: r.id });
    if (r.status === 404) throw new Refusal(NOT_FOUND, 404);
    throw new Refusal("Some entries need fixing.", 400, r.issues);
  },
);
