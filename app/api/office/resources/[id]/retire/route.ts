import { created, idParam, json, route } from "@/app/_server/route";
import { retireResource } from "@/db/calendar/resources";
import { retireResourceSchema } from "@/lib/calendar/rules";

// POST /api/office/resources/[id]/retire: retires a resource with the reason (once; no new bookings on it).
export const POST = route(
  { access: { area: "office" }, params: ["id"], body: json(retireResourceSchema) },
  async ({ user, params, body, db }) => created(await retireResource(db, user, idParam(params.id), body.reason)),
);
