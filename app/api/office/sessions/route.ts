import { json, route } from "@/app/_server/route";
import { appendAudit } from "@/db/audit/append";
import { listOutboxHandovers } from "@/db/auth/outbox-handovers";
import { endSessions, listOpenSessions } from "@/db/auth/sessions";
import { endSessionsSchema } from "@/lib/auth/session-schemas";

// GET: the shop's open sessions and the work tablets handed over after theirs were ended.
// POST: end every session of one person ({ userId }) or of one tablet ({ deviceId }) at once; the
// old cookies are refused from the next request, and the tablet lets go of its data (it hands
// its unsent work over first: app/api/bench/outbox-handover).
export const GET = route({ access: { area: "users" } }, async ({ user, db }) => ({
  sessions: await listOpenSessions(db, user.shopId),
  handovers: await listOutboxHandovers(db, user.shopId),
}));

export const POST = route({ access: { area: "users" }, body: json(endSessionsSchema) }, async ({ user, body, db }) => {
  const ended = await endSessions(db, user.shopId, body, "userId" in body ? "ended-by-office" : "tablet-ended-by-office", user.id);
  await appendAudit(db, [
    {
      shopId: user.shopId,
      actorId: user.id,
      deviceId: "deviceId" in body ? body.deviceId : null,
      action: "userId" in body ? "session.ended-for-user" : "session.ended-for-tablet",
      entity: "userId" in body ? "user" : "device",
      entityId: "userId" in body ? body.userId : body.deviceId,
      outcome: "accepted",
      detail: { sessionsEnded: ended },
    },
  ]);
  return { ended };
});
