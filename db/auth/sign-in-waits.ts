import "server-only";
import { sql, type Kysely, type RawBuilder, type Transaction } from "kysely";
import { parseBucketKey, SIGN_IN_WAITS } from "@/lib/auth/sign-in-throttle";
import type { Database } from "../schema";

type Db = Kysely<Database> | Transaction<Database>;

// Sign-in attempts per bucket (lib/auth/sign-in-throttle.ts has the rule). Rows are only added:
// a success or the office's clearing starts a bucket's count afresh.

export interface BucketState {
  key: string;
  failures: number;
  secondsSinceLastFailure: number | null;
}

/** Since when a bucket's failures count: the window, its last success, the office's last clearing, whichever is latest. */
const countedSince = (key: RawBuilder<unknown>) => sql`greatest(
  now() - make_interval(mins => ${SIGN_IN_WAITS.windowMinutes}),
  coalesce((SELECT max(s.at) FROM sign_in_attempts s WHERE s.key = ${key} AND s.succeeded), '-infinity'),
  coalesce((SELECT max(c.cleared_at) FROM sign_in_waits_cleared c WHERE c.key = ${key}), '-infinity'))`;

export async function bucketStates(db: Db, keys: readonly string[]): Promise<Map<string, BucketState>> {
  const { rows } = await sql<{ key: string; failures: string; since: string | null }>`
    SELECT k.key,
           count(a.id) AS failures,
           extract(epoch FROM now() - max(a.at)) AS since
    FROM unnest(${sql.val([...keys])}::text[]) AS k(key)
    LEFT JOIN LATERAL (
      SELECT a.id, a.at FROM sign_in_attempts a
      WHERE a.key = k.key AND NOT a.succeeded
        AND a.at > ${countedSince(sql.ref("k.key"))}
    ) a ON true
    GROUP BY k.key`.execute(db);
  return new Map(
    rows.map((r) => [
      r.key,
      { key: r.key, failures: Number(r.failures), secondsSinceLastFailure: r.since === null ? null : Number(r.since) },
    ]),
  );
}

export async function recordSignInAttempt(db: Db, keys: readonly string[], succeeded: boolean, shopId: string | null): Promise<void> {
  if (!keys.length) return;
  await db
    .insertInto("sign_in_attempts")
    .values(keys.map((key) => ({ key, succeeded, shop_id: shopId })))
    .execute();
}

/** Attempts from one address wait for each other (a burst is counted one by one, not all at zero). */
export async function holdAddressForSignIn(trx: Transaction<Database>, address: string): Promise<void> {
  await sql`SELECT pg_advisory_xact_lock(hashtext(${`sign-in:${address}`}))`.execute(trx);
}

/** Buckets with failures in the window that touched an account of the shop, for the office. */
export async function listSignInBuckets(db: Kysely<Database>, shopId: string): Promise<BucketState[]> {
  const keys = await db
    .selectFrom("sign_in_attempts")
    .select("key")
    .distinct()
    .where("shop_id", "=", shopId)
    .where("succeeded", "=", false)
    .where(sql<boolean>`at > now() - make_interval(mins => ${SIGN_IN_WAITS.windowMinutes})`)
    .execute();
  const known = keys.map((k) => k.key).filter((k) => parseBucketKey(k));
  if (!known.length) return [];
  const states = await bucketStates(db, known);
  return [...states.values()].filter((s) => s.failures > 0).sort((a, b) => b.failures - a.failures);
}

/**
 * The office clears a bucket: its count starts again from now. Only a bucket that touched the
 * shop ("not-ours" otherwise), and only when every failure it counts now was against one of the
 * shop's own sign-ins ("others-too" otherwise): a count of one address is shared by every shop,
 * so one shop's office must not reset the wait that guards another shop's accounts (or addresses
 * nobody has) against guessing.
 */
export async function clearSignInBucket(
  db: Kysely<Database>,
  shopId: string,
  key: string,
  by: string,
): Promise<"cleared" | "not-ours" | "others-too"> {
  const touched = await db
    .selectFrom("sign_in_attempts")
    .select("id")
    .where("shop_id", "=", shopId)
    .where("key", "=", key)
    .limit(1)
    .executeTakeFirst();
  if (!touched) return "not-ours";
  const { rows } = await sql<{ n: number }>`
    SELECT count(*)::int AS n FROM sign_in_attempts a
    WHERE a.key = ${key} AND NOT a.succeeded AND a.shop_id IS DISTINCT FROM ${shopId}::uuid
      AND a.at > ${countedSince(sql.val(key))}`.execute(db);
  if (rows[0].n > 0) return "others-too";
  await db.insertInto("sign_in_waits_cleared").values({ key, shop_id: shopId, cleared_by: by }).execute();
  return "cleared";
}
