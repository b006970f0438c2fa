import "server-only";
import { sql, type Kysely, type Transaction } from "kysely";
import {
  endedByOthers,
  SESSION_ABSOLUTE_S,
  SESSION_IDLE_S,
  SESSION_RENEW_EVERY_S,
  type SessionEndReason,
  type SessionState,
} from "@/lib/auth/session-lifetime";
import type { Role } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import type { Database } from "../schema";

type Db = Kysely<Database> | Transaction<Database>;

// Sessions kept on the server (lib/auth/session-lifetime.ts has the numbers). The signed cookie
// carries only the session's id; every request looks the session up here, so ending it on the
// server ends it everywhere at once.

export async function startSession(
  db: Db,
  user: { id: string; shopId: string; role: Role },
  seen: { address: string; userAgent: string },
): Promise<string> {
  const idle = SESSION_IDLE_S[user.role];
  const row = await db
    .insertInto("sessions")
    .values({
      user_id: user.id,
      shop_id: user.shopId,
      client_address: seen.address.slice(0, 80),
      user_agent: seen.userAgent.slice(0, 300),
      idle_seconds: idle,
      expires_at: sql<Date>`now() + make_interval(secs => ${idle})`,
      absolute_expires_at: sql<Date>`now() + make_interval(secs => ${SESSION_ABSOLUTE_S})`,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return row.id;
}

export type SessionLookup = { user: SessionUser; sessionId: string } | { refused: SessionState };

/**
 * The user of an open session, sliding its idle expiry forward (written at most once a minute).
 * `refused: "ended"` when the session was ended by someone else (the office, or the user turned
 * off); "expired" for a session signed out, lapsed or unknown.
 */
export async function userOfSession(db: Kysely<Database>, sessionId: string): Promise<SessionLookup> {
  const row = await db
    .selectFrom("sessions as s")
    .innerJoin("users as u", "u.id", "s.user_id")
    .select([
      "u.id",
      "u.shop_id as shopId",
      "u.role",
      "u.name",
      "u.email",
      "u.customer_id as customerId",
      "u.active",
      "s.ended_reason as endedReason",
      sql<boolean>`s.ended_at IS NULL AND s.expires_at > now() AND s.absolute_expires_at > now()`.as("open"),
      sql<boolean>`s.last_seen_at < now() - make_interval(secs => ${SESSION_RENEW_EVERY_S})`.as("renew"),
    ])
    .where("s.id", "=", sessionId)
    .where("s.shop_id", "=", sql<string>`u.shop_id`)
    .executeTakeFirst();
  if (!row) return { refused: "expired" };
  if (!row.open || !row.active) return { refused: endedByOthers(row.endedReason) || !row.active ? "ended" : "expired" };
  if (row.renew) {
    await db
      .updateTable("sessions")
      .set({
        last_seen_at: sql<Date>`now()`,
        expires_at: sql<Date>`least(absolute_expires_at, now() + make_interval(secs => idle_seconds))`,
      })
      .where("id", "=", sessionId)
      .where("ended_at", "is", null)
      .execute();
  }
  const { id, shopId, role, name, email, customerId } = row;
  return { user: { id, shopId, role, name, email, customerId }, sessionId };
}

export async function endSession(db: Db, sessionId: string, reason: SessionEndReason, by: string | null = null): Promise<void> {
  await db
    .updateTable("sessions")
    .set({ ended_at: sql<Date>`now()`, ended_reason: reason, ended_by: by })
    .where("id", "=", sessionId)
    .where("ended_at", "is", null)
    .execute();
}

/** Ends every open session of a user, or of one tablet (device id), in the shop. Returns how many. */
export async function endSessions(
  db: Db,
  shopId: string,
  which: { userId: string; exceptSessionId?: string | null } | { deviceId: string },
  reason: SessionEndReason,
  by: string | null,
): Promise<number> {
  let q = db
    .updateTable("sessions")
    .set({ ended_at: sql<Date>`now()`, ended_reason: reason, ended_by: by })
    .where("shop_id", "=", shopId)
    .where("ended_at", "is", null);
  q = "userId" in which ? q.where("user_id", "=", which.userId) : q.where("device_id", "=", which.deviceId);
  if ("exceptSessionId" in which && which.exceptSessionId) q = q.where("id", "!=", which.exceptSessionId);
  const r = await q.executeTakeFirst();
  return Number(r.numUpdatedRows);
}

/** Notes which tablet a session is on (the bench sends its device id when it opens). */
export async function noteSessionDevice(db: Db, sessionId: string, deviceId: string): Promise<void> {
  await db
    .updateTable("sessions")
    .set({ device_id: deviceId })
    .where("id", "=", sessionId)
    .where("ended_at", "is", null)
    .where((eb) => eb.or([eb("device_id", "is", null), eb("device_id", "!=", deviceId)]))
    .execute();
}

/** The shop's open sessions, newest first, for the office. */
export async function listOpenSessions(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("sessions as s")
    .innerJoin("users as u", "u.id", "s.user_id")
    .select([
      "s.id",
      "s.user_id as userId",
      "u.name as userName",
      "u.role",
      "s.device_id as deviceId",
      "s.client_address as clientAddress",
      "s.started_at as startedAt",
      "s.last_seen_at as lastSeenAt",
      "s.expires_at as expiresAt",
    ])
    .where("s.shop_id", "=", shopId)
    .where("s.ended_at", "is", null)
    .where(sql<boolean>`s.expires_at > now() AND s.absolute_expires_at > now()`)
    .orderBy("s.last_seen_at", "desc")
    .execute();
}

/** How long after the office ends a session its tablet may still hand over its unsent work. */
export const HANDOVER_WINDOW_DAYS = 7;

/** A session the office ended (or whose user was turned off) lately: its tablet may hand over its outbox. */
export async function sessionEndedByOthers(db: Kysely<Database>, sessionId: string) {
  return db
    .selectFrom("sessions")
    .select(["id", "user_id as userId", "shop_id as shopId", "device_id as deviceId", "ended_reason as endedReason"])
    .where("id", "=", sessionId)
    .where("ended_reason", "in", ["ended-by-office", "tablet-ended-by-office", "user-turned-off"])
    .where(sql<boolean>`ended_at > now() - make_interval(days => ${HANDOVER_WINDOW_DAYS})`)
    .executeTakeFirst();
}
