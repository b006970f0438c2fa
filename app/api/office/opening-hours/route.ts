import { json, route } from "@/app/_server/route";
import { shopHours } from "@/db/calendar/bookings";
import { setOpeningHours } from "@/db/calendar/hours";
import { openingHoursSchema } from "@/lib/calendar/rules";

// GET /api/office/opening-hours: the shop's opening hours and zone.
export const GET = route({ access: { area: "office" } }, async ({ user, db }) => shopHours(db, user.shopId));

// PUT /api/office/opening-hours: new opening hours for bookings from now on (audited, before and after).
export const PUT = route({ access: { area: "office" }, body: json(openingHoursSchema) }, async ({ user, body, db }) =>
  setOpeningHours(db, user, body),
);
