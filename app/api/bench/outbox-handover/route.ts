import { json, publicRoute, reply } from "@/app/_server/route";
import { signedInClaim } from "@/app/_server/signed-in";
import { appendAudit } from "@/db/audit/append";
import { recordOutboxHandover } from "@/db/auth/outbox-handovers";
import { sessionEndedByOthers } from "@/db/auth/sessions";
import { outboxHandoverSchema } from "@/lib/auth/session-schemas";
import { Refusal } from "@/lib/errors";
import { isUuid } from "@/lib/ids";
import { SYNC_LIMITS } from "@/lib/sync/operations";

// POST: a tablet whose session the office ended (or whose user was turned off) hands over the
// work it had not sent, before it clears its store. Its signed cookie must name such a session,
// ended in the last 7 days; nothing else may be done with it. The entries are kept as they came
// (outbox_handovers), not merged into the job record: nobody signed in stands behind them now.
// The office reads them on the Sign-ins page.
export const POST = publicRoute(
  { check: "ended-session", body: json(outboxHandoverSchema, { maxBytes: SYNC_LIMITS.maxBodyBytes, anyText: true }) },
  async ({ body, db }) => {
    const claim = await signedInClaim();
    const session = claim && isUuid(claim.sessionId) ? await sessionEndedByOthers(db, claim.sessionId) : null;
    if (!claim || !session || session.userId !== claim.userId)
      throw new Refusal("Only a tablet whose session the office ended may hand work over.", 401);
    const made = await recordOutboxHandover(db, {
      shopId: session.shopId,
      userId: session.userId,
      sessionId: session.id,
      sessionDeviceId: session.deviceId,
      deviceId: body.deviceId,
      entries: body.entries,
      photosLeft: body.photosLeft,
    });
    await appendAudit(db, [
      {
        shopId: session.shopId,
        actorId: session.userId,
        deviceId: body.deviceId,
        action: "outbox.handed-over",
        entity: "outbox_handover",
        entityId: made.id,
        outcome: "accepted",
        detail: { entries: body.entries.length, photosLeft: body.photosLeft.length, endedReason: session.endedReason },
      },
    ]);
    return reply({ id: made.id, entries: body.entries.length }, { status: 201 });
  },
);
