import { created, json, route } from "@/app/_server/route";
import { reserveToJob } from "@/db/stock/reserve";
import { reservationSchema } from "@/lib/stock/input";

// POST /api/office/stock/reservations: puts stock aside for a job (refused when that much is not free).
export const POST = route({ access: { area: "office" }, body: json(reservationSchema) }, async ({ user, body, db }) =>
  created(await reserveToJob(db, user, body)),
);
