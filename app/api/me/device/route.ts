import { json, route } from "@/app/_server/route";
import { noteSessionDevice } from "@/db/auth/sessions";
import { sessionDeviceSchema } from "@/lib/auth/session-schemas";

// POST: the bench names the tablet it runs on, so the office can end that tablet's sessions.
export const POST = route({ access: { area: "bench" }, body: json(sessionDeviceSchema) }, async ({ body, db, sessionId }) => {
  if (sessionId) await noteSessionDevice(db, sessionId, body.deviceId);
  return { deviceId: body.deviceId };
});
