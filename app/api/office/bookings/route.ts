import { created, json, route } from "@/app/_server/route";
import { bookWorkOrder } from "@/db/calendar/bookings";
import { newBookingSchema } from "@/lib/calendar/rules";

// POST /api/office/bookings: books a job on a resource for a day's time range (a clash is refused naming the booking there).
export const POST = route({ access: { area: "office" }, body: json(newBookingSchema) }, async ({ user, body, db }) =>
  created(await bookWorkOrder(db, user, body)),
);
