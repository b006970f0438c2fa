import "server-only";
import { endSessions } from "../auth/sessions";
import { createHash, randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import { sql, type Kysely } from "kysely";
import { Refusal } from "@/lib/errors";
import { INVITATION_LIFETIME_HOURS, judgeLink, type LinkFacts } from "@/lib/customer-contact/invitation-rules";
import type { Database } from "../schema";

// Invitations to set a password (tables customer_invitations, invitation_links, invitation_uses).
// The office's request is recorded at once; the link is made when the e-mail is sent, so the token
// exists only in that e-mail: the database keeps its SHA-256. A token is 32 random bytes (256 bits),
// so a plain hash is enough (no guessing a slow hash could slow down). Locking the sign-in's row
// makes a link's use and the making of a newer link take turns: a link is used once, and never
// after a newer one was made.

const hashOf = (token: string) => createHash("sha256").update(token, "utf8").digest();

/** The office asks for an invitation e-mail for a customer's sign-in of its shop. */
export async function recordInvitation(db: Kysely<Database>, shopId: string, actorId: string, userId: string) {
  const u = await db
    .selectFrom("users as u")
    .innerJoin("customers as c", "c.id", "u.customer_id")
    .innerJoin("shops as s", "s.id", "u.shop_id")
    .select(["u.id", "u.email", "u.name", "u.role", "u.active", "c.name as customerName", "s.name as shopName"])
    .where("u.id", "=", userId)
    .where("u.shop_id", "=", shopId)
    .executeTakeFirst();
  if (!u || u.role !== "customer") throw new Refusal("Invitations are for customers' sign-ins of this shop.", 404);
  if (!u.active) throw new Refusal("This sign-in is turned off: turn it on before sending an invitation.", 409);
  const made = await db
    .insertInto("customer_invitations")
    .values({ shop_id: shopId, user_id: userId, invited_by: actorId })
    .returning(["id", "invited_at as invitedAt"])
    .executeTakeFirstOrThrow();
  return { id: made.id, invitedAt: made.invitedAt, email: u.email, name: u.customerName, shopName: u.shopName };
}

/**
 * Makes the link of an invitation as its e-mail is sent, and answers its token (the only place
 * it ever is). Every earlier link of the same sign-in stops working.
 */
export async function makeInvitationLink(db: Kysely<Database>, invitationId: string): Promise<string> {
  return db.transaction().execute(async (trx) => {
    const inv = await trx
      .selectFrom("customer_invitations")
      .select(["id", "shop_id", "user_id"])
      .where("id", "=", invitationId)
      .executeTakeFirstOrThrow();
    await trx.selectFrom("users").select("id").where("id", "=", inv.user_id).forUpdate().execute();
    const token = randomBytes(32).toString("base64url");
    await trx
      .insertInto("invitation_links")
      .values({
        shop_id: inv.shop_id,
        invitation_id: inv.id,
        user_id: inv.user_id,
        token_sha256: hashOf(token),
        expires_at: sql<Date>`clock_timestamp() + make_interval(hours => ${INVITATION_LIFETIME_HOURS})`,
      })
      .execute();
    return token;
  });
}

type Reader = Kysely<Database>;

/** What is known about the link of `token` (null when it is none of ours). */
async function linkFacts(db: Reader, token: string) {
  const row = await db
    .selectFrom("invitation_links as l")
    .innerJoin("users as u", "u.id", "l.user_id")
    .innerJoin("shops as s", "s.id", "l.shop_id")
    .leftJoin("invitation_uses as x", "x.link_id", "l.id")
    .select((eb) => [
      "l.id",
      "l.user_id as userId",
      "l.shop_id as shopId",
      "l.expires_at as expiresAt",
      "x.used_at as usedAt",
      "u.active as userActive",
      "u.email",
      "u.name",
      "s.name as shopName",
      eb
        .exists(
          eb
            .selectFrom("invitation_links as n")
            .select("n.id")
            .whereRef("n.user_id", "=", "l.user_id")
            .whereRef("n.made_at", ">", "l.made_at"),
        )
        .as("newerSent"),
    ])
    .where("l.token_sha256", "=", hashOf(token))
    .executeTakeFirst();
  return row ? { ...row, newerSent: Boolean(row.newerSent) } : null;
}

/** What the invitation page shows: whose sign-in the link is for, or why it does not work. */
export async function checkInvitationLink(db: Reader, token: string, signedInUserId: string | null, now = new Date()) {
  const link = await linkFacts(db, token);
  const verdict = judgeLink(link satisfies LinkFacts | null, now, signedInUserId);
  return { verdict, email: link?.email ?? null, name: link?.name ?? null, shopName: link?.shopName ?? null };
}

/**
 * Sets the sign-in's password from an invitation link and uses the link up, in one transaction;
 * refused (nothing changed) when the link is unknown, used, replaced by a newer one, expired, for
 * a turned-off sign-in, or for another sign-in than the one the browser is signed in with.
 */
export async function setPasswordFromLink(
  db: Kysely<Database>,
  input: { token: string; password: string; signedInUserId: string | null },
): Promise<{ userId: string; shopId: string; email: string; linkId: string }> {
  const passwordHash = await bcrypt.hash(input.password, 10);
  return db.transaction().execute(async (trx) => {
    const first = await linkFacts(trx, input.token);
    // take the sign-in's row, then look again: a use or a newer link made meanwhile is seen
    if (first) await trx.selectFrom("users").select("id").where("id", "=", first.userId).forUpdate().execute();
    const link = first && (await linkFacts(trx, input.token));
    const nowRow = await sql<{ now: Date }>`SELECT clock_timestamp() AS now`.execute(trx);
    const verdict = judgeLink(link, nowRow.rows[0].now, input.signedInUserId);
    if (!verdict.ok || !link) throw new Refusal(verdict.ok ? "Not found." : verdict.message, verdict.ok ? 404 : verdict.status);
    const used = await trx
      .insertInto("invitation_uses")
      .values({ link_id: link.id })
      .onConflict((oc) => oc.doNothing())
      .returning("link_id")
      .execute();
    if (!used.length) {
      const again = judgeLink({ ...link, usedAt: new Date() }, new Date(0), null);
      throw new Refusal(again.ok ? "" : again.message, 409);
    }
    await trx.updateTable("users").set({ password_hash: passwordHash }).where("id", "=", link.userId).execute();
    // every session of the sign-in ends with the old password: whoever held one signs in anew
    await endSessions(trx, link.shopId, { userId: link.userId }, "password-set", link.userId);
    return { userId: link.userId, shopId: link.shopId, email: link.email, linkId: link.id };
  });
}

/** The newest invitation of each customer sign-in of the shop, for the Sign-ins page. */
export async function latestInvitations(db: Reader, shopId: string) {
  const rows = await db
    .selectFrom("customer_invitations as i")
    .leftJoin("invitation_links as l", "l.invitation_id", "i.id")
    .leftJoin("invitation_uses as x", "x.link_id", "l.id")
    .select(["i.user_id as userId", "i.invited_at as invitedAt", "l.expires_at as expiresAt", "x.used_at as usedAt"])
    .where("i.shop_id", "=", shopId)
    .orderBy("i.invited_at", "desc")
    .orderBy("l.made_at", "desc")
    .execute();
  const newest = new Map<string, (typeof rows)[number]>();
  for (const r of rows) if (!newest.has(r.userId)) newest.set(r.userId, r);
  return newest;
}
