import { created, idParam, json, route } from "@/app/_server/route";
import { addReminder } from "@/db/aftercare/reminders";
import { newReminderSchema } from "@/lib/aftercare/reminders";

// POST /api/office/work-orders/[id]/reminders: a reminder added by hand to a handed-over job
// (a day in the past is refused with the reason).
export const POST = route(
  { access: { area: "office" }, params: ["id"], body: json(newReminderSchema) },
  async ({ user, params, body, db }) => created(await addReminder(db, user, idParam(params.id), body)),
);
