import "server-only";
import { randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import type { Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { Refusal } from "@/lib/errors";
import type { newUserSchema } from "@/lib/office/user-schema";
import type { z } from "zod";
import { endSessions } from "../auth/sessions";
import type { Database } from "../schema";
import { withKeysHeld } from "../setup/key-locks";

export async function listShopUsers(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("users as u")
    .leftJoin("customers as c", "c.id", "u.customer_id")
    .select(["u.id", "u.name", "u.email", "u.role", "u.active", "c.name as customerName"])
    .where("u.shop_id", "=", shopId)
    .orderBy("u.active", "desc")
    .orderBy("u.role")
    .orderBy("u.name")
    .execute();
}

export async function createShopUser(db: Kysely<Database>, shopId: string, input: z.output<typeof newUserSchema>): Promise<{ id: string }> {
  // no password given (a customer invited by e-mail): a hash of random bytes nobody knows, until
  // they set their own from the invitation link (hashed before the keys are held)
  const passwordHash = await bcrypt.hash(input.password ?? randomBytes(32).toString("base64url"), 10);
  // the e-mail and the customer are checked and written one request at a time (two clicks on Save,
  // two offices at once): the second is refused in words below, never by the unique index
  const keys = [`user-email:${input.email}`, ...(input.customerId ? [`customer-sign-in:${input.customerId}`] : [])];
  return withKeysHeld(db, keys, async (trx) => {
    const taken = await trx.selectFrom("users").select("id").where("email", "=", input.email).executeTakeFirst();
    if (taken) throw new Refusal("That e-mail already has a sign-in.", 409, [{ path: "email", message: "already has a sign-in" }]);
    if (input.customerId) {
      const c = await trx
        .selectFrom("customers")
        .select("id")
        .where("id", "=", input.customerId)
        .where("shop_id", "=", shopId)
        .executeTakeFirst();
      if (!c)
        throw new Refusal("That customer is not in this shop.", 400, [{ path: "customerId", message: "not a customer of this shop" }]);
      const has = await trx.selectFrom("users").select("id").where("customer_id", "=", input.customerId).executeTakeFirst();
      if (has) throw new Refusal("That customer already has a sign-in.", 409, [{ path: "customerId", message: "already has a sign-in" }]);
    }
    return trx
      .insertInto("users")
      .values({
        shop_id: shopId,
        name: input.name,
        email: input.email,
        role: input.role,
        password_hash: passwordHash,
        customer_id: input.customerId,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
  });
}

/**
 * Turns a sign-in on or off (never deletes: the records it made keep their author). Turning it
 * off ends every session of the user at once; turning it on again revives none of them.
 */
export async function setUserActive(db: Kysely<Database>, shopId: string, actorId: string, userId: string, active: boolean): Promise<void> {
  if (userId === actorId && !active) throw new Refusal("You cannot turn off your own sign-in.", 400);
  await db.transaction().execute(async (trx) => {
    const r = await trx.updateTable("users").set({ active }).where("id", "=", userId).where("shop_id", "=", shopId).executeTakeFirst();
    if (!r.numUpdatedRows) throw new Refusal("Not found.", 404);
    if (!active) await endSessions(trx, shopId, { userId }, "user-turned-off", actorId);
  });
}

export async function findUserForSignIn(db: Kysely<Database>, email: string) {
  return db
    .selectFrom("users")
    .select(["id", "shop_id", "role", "name", "email", "customer_id", "password_hash", "active"])
    .where("email", "=", email)
    .executeTakeFirst();
}

export async function loadSessionUser(db: Kysely<Database>, id: string): Promise<SessionUser | null> {
  const row = await db
    .selectFrom("users")
    .select(["id", "shop_id", "role", "name", "email", "customer_id"])
    .where("id", "=", id)
    .where("active", "=", true)
    .executeTakeFirst();
  return row ? { id: row.id, shopId: row.shop_id, role: row.role, name: row.name, email: row.email, customerId: row.customer_id } : null;
}

/** The user's e-mail and password hash, the row held until the transaction ends (a password change reads, then writes). */
export async function lockPasswordOf(trx: Kysely<Database>, userId: string) {
  return trx
    .selectFrom("users")
    .select(["id", "shop_id", "email", "password_hash", "active"])
    .where("id", "=", userId)
    .forUpdate()
    .executeTakeFirst();
}

export async function setPasswordHash(trx: Kysely<Database>, userId: string, passwordHash: string): Promise<void> {
  await trx.updateTable("users").set({ password_hash: passwordHash }).where("id", "=", userId).execute();
}
