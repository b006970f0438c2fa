import { created, idParam, json, route } from "@/app/_server/route";
import { setPromisedDate } from "@/db/calendar/promises";
import { promiseSchema } from "@/lib/calendar/rules";

// POST /api/office/work-orders/[id]/promise: the day the bike is promised back (a new record each time; the newest counts).
export const POST = route({ access: { area: "office" }, params: ["id"], body: json(promiseSchema) }, async ({ user, params, body, db }) =>
  created(await setPromisedDate(db, user, idParam(params.id), body.promisedOn)),
);
