import { created, json, route } from "@/app/_server/route";
import { addResource, listResources } from "@/db/calendar/resources";
import { newResourceSchema } from "@/lib/calendar/rules";

// GET /api/office/resources: the shop's bays, lifts, dyno and mechanics (retired ones marked).
export const GET = route({ access: { area: "office" } }, async ({ user, db }) => ({ resources: await listResources(db, user.shopId) }));

// POST /api/office/resources: a new resource (a mechanic resource may name the mechanic).
export const POST = route({ access: { area: "office" }, body: json(newResourceSchema) }, async ({ user, body, db }) =>
  created(await addResource(db, user, body)),
);
