import { created, json, route } from "@/app/_server/route";
import { openComeBack } from "@/db/aftercare/come-backs";
import { openComeBackSchema } from "@/lib/aftercare/come-backs";

// POST /api/come-backs: opens a come-back on a handed-over work order (office or supervisor): a new
// work order for the same bike, booked in, linked to the original.
export const POST = route({ access: { area: "come-backs" }, body: json(openComeBackSchema) }, async ({ user, body, db }) =>
  created(await openComeBack(db, user, body)),
);
