import { created, idParam, json, route } from "@/app/_server/route";
import { markReminderDone } from "@/db/aftercare/reminders";
import { reminderDoneSchema } from "@/lib/aftercare/reminders";

// POST /api/office/reminders/[id]/done: records that the reminder's check or service was done (once, append-only).
export const POST = route(
  { access: { area: "office" }, params: ["id"], body: json(reminderDoneSchema) },
  async ({ user, params, body, db }) => created(await markReminderDone(db, user, idParam(params.id), body)),
);
