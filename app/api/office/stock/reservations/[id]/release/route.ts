import { idParam, json, route } from "@/app/_server/route";
import { releaseReservation } from "@/db/stock/reserve";
import { releaseSchema } from "@/lib/stock/input";

// POST /api/office/stock/reservations/[id]/release: lets go what is still put aside, with a reason.
export const POST = route({ access: { area: "office" }, params: ["id"], body: json(releaseSchema) }, async ({ user, params, body, db }) =>
  releaseReservation(db, user, idParam(params.id, "No such reservation."), body.reason),
);
