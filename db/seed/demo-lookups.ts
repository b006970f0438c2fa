import type { Kysely } from "kysely";
import type { Database } from "../schema";

// Lookups the demo seeds share: the demo shop's people, customers and template versions by the
// names the seeds know them by.

/** The invented customer who owns the demo jobs beyond 1001–1010 (Noor Haddad). */
export const DEMO_JOB_OWNER = "noor.haddad@example.test";

/** The id of the demo shop's user with this e-mail. */
export async function demoUserId(db: Kysely<Database>, shopId: string, email: string): Promise<string> {
  return (await db.selectFrom("users").select("id").where("shop_id", "=", shopId).where("email", "=", email).executeTakeFirstOrThrow()).id;
}

/** The id of the demo shop's customer with this e-mail. */
export async function demoCustomerId(db: Kysely<Database>, shopId: string, email: string): Promise<string> {
  return (await db.selectFrom("customers").select("id").where("shop_id", "=", shopId).where("email", "=", email).executeTakeFirstOrThrow())
    .id;
}

/** The id of the first version of the demo shop's template with this key. */
export async function firstTemplateVersionId(db: Kysely<Database>, shopId: string, key: string): Promise<string> {
  const version = await db
    .selectFrom("template_versions as v")
    .innerJoin("procedure_templates as t", "t.id", "v.template_id")
    .select("v.id")
    .where("t.shop_id", "=", shopId)
    .where("t.key", "=", key)
    .orderBy("v.version")
    .executeTakeFirstOrThrow();
  return version.id;
}

/** Whether the demo shop has a work order with this number (a seed's "already written?" check). */
export async function demoJobExists(db: Kysely<Database>, shopId: string, number: number): Promise<boolean> {
  const row = await db.selectFrom("work_orders").select("id").where("shop_id", "=", shopId).where("number", "=", number).executeTakeFirst();
  return Boolean(row);
}
