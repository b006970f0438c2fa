import { created, idParam, json, route } from "@/app/_server/route";
import { cancelBooking } from "@/db/calendar/bookings";
import { cancelBookingSchema } from "@/lib/calendar/rules";

// POST /api/office/bookings/[id]/cancel: cancels a booking with the reason (its own record; the slot is free again).
export const POST = route(
  { access: { area: "office" }, params: ["id"], body: json(cancelBookingSchema) },
  async ({ user, params, body, db }) => created(await cancelBooking(db, user, idParam(params.id), body.reason)),
);
