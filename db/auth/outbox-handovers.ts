import "server-only";
import { Refusal } from "@/lib/errors";
import type { Kysely } from "kysely";
import { storableCopy } from "@/lib/safe-values";
import type { Database } from "../schema";

// The unsent work of a tablet whose session the office ended, handed over as it was on the
// tablet (not merged into the record: nobody signed in stands behind it any more). The office
// reads it and downloads it; it is kept for good. Kept as a copy jsonb accepts, whatever the
// tablet held (a NUL or half of an emoji is written out as its \u escape; nothing is cut short):
// an entry the server would refuse must not stop the rest from being handed over.

/**
 * Hand-overs one ended session may make. A tablet makes one, and a further round or two for work
 * recorded while the first was on its way (lib/client/session-end.ts): an ended session's cookie
 * must not become a way to fill the database for its seven days.
 */
export const MAX_HANDOVERS_PER_SESSION = 10;

export async function recordOutboxHandover(
  db: Kysely<Database>,
  h: {
    shopId: string;
    userId: string;
    sessionId: string;
    /** The tablet the session was named to, when it was (the hand-over must come from that one). */
    sessionDeviceId?: string | null;
    deviceId: string;
    entries: unknown[];
    photosLeft: unknown[];
  },
): Promise<{ id: string }> {
  if (h.sessionDeviceId && h.sessionDeviceId !== h.deviceId)
    throw new Refusal("This hand-over names another tablet than the one this session was on: nothing was kept.", 403);
  return db.transaction().execute(async (trx) => {
    // one session's hand-overs one at a time, so the count below holds
    await trx.selectFrom("sessions").select("id").where("id", "=", h.sessionId).forUpdate().execute();
    const made = await trx
      .selectFrom("outbox_handovers")
      .select((eb) => eb.fn.countAll<string>().as("n"))
      .where("session_id", "=", h.sessionId)
      .executeTakeFirstOrThrow();
    if (Number(made.n) >= MAX_HANDOVERS_PER_SESSION)
      throw new Refusal(
        `This tablet has handed its work over ${MAX_HANDOVERS_PER_SESSION} times already: the office has it on the Sign-ins page. Nothing more was kept.`,
        409,
      );
    return trx
      .insertInto("outbox_handovers")
      .values({
        shop_id: h.shopId,
        user_id: h.userId,
        session_id: h.sessionId,
        device_id: h.deviceId,
        entry_count: h.entries.length,
        entries: JSON.stringify(storableCopy(h.entries, Infinity)),
        photos_left: JSON.stringify(storableCopy(h.photosLeft, Infinity)),
      })
      .returning("id")
      .executeTakeFirstOrThrow();
  });
}

export async function listOutboxHandovers(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("outbox_handovers as h")
    .innerJoin("users as u", "u.id", "h.user_id")
    .select(["h.id", "u.name as userName", "h.device_id as deviceId", "h.entry_count as entryCount", "h.received_at as receivedAt"])
    .where("h.shop_id", "=", shopId)
    .orderBy("h.received_at", "desc")
    .limit(50)
    .execute();
}

export async function outboxHandover(db: Kysely<Database>, shopId: string, id: string) {
  return db
    .selectFrom("outbox_handovers")
    .select(["id", "user_id as userId", "device_id as deviceId", "entries", "photos_left as photosLeft", "received_at as receivedAt"])
    .where("shop_id", "=", shopId)
    .where("id", "=", id)
    .executeTakeFirst();
}
