import { idParam, route } from "@/app/_server/route";
import { listWorkOrderBookings } from "@/db/calendar/bookings";

// GET /api/jobs/[id]/dyno-bookings: the job's live dyno bookings (read by whoever may work the dyno).
export const GET = route({ access: { area: "dyno" }, params: ["id"] }, async ({ user, params, db }) => ({
  bookings: await listWorkOrderBookings(db, user.shopId, idParam(params.id), "dyno"),
}));
