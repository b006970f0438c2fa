import { sql, type Kysely } from "kysely";
import { SIGN_IN_LIMIT } from "@/lib/auth/credentials";
import type { SessionUser } from "@/lib/auth/session-user";
import type { Database } from "./schema";

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
  return row
    ? { id: row.id, shopId: row.shop_id, role: row.role, name: row.name, email: row.email, customerId: row.customer_id }
    : null;
}

// Failed attempts for a key (e-mail or client address) inside the rate-limit window.
export async function recentSignInFailures(db: Kysely<Database>, key: string): Promise<number> {
  const row = await db
    .selectFrom("sign_in_attempts")
    .select((eb) => eb.fn.countAll<number>().as("n"))
    .where("key", "=", key)
    .where("succeeded", "=", false)
    .where(sql<boolean>`at > now() - make_interval(mins => ${SIGN_IN_LIMIT.windowMinutes})`)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

export async function recordSignInAttempt(db: Kysely<Database>, keys: string[], succeeded: boolean): Promise<void> {
  await db
    .insertInto("sign_in_attempts")
    .values(keys.map((key) => ({ key, succeeded })))
    .execute();
}
