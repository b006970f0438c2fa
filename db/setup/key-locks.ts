import "server-only";
import { sql, type Kysely, type Transaction } from "kysely";
import type { Database } from "@/db/schema";

/**
 * Runs `work` in one transaction that first holds an advisory lock for each key, until it ends.
 * A check-then-write (is this e-mail taken? then insert) holds the key it checks, so two requests
 * at once are decided one after the other: the second sees the first's row and is refused in
 * words, instead of both passing the check and one failing the unique index as a server error.
 * Inside a transaction already, the locks join it. Keys are taken in one order (no deadlock).
 */
export async function withKeysHeld<T>(
  db: Kysely<Database>,
  keys: readonly string[],
  work: (trx: Transaction<Database>) => Promise<T>,
): Promise<T> {
  const run = async (trx: Transaction<Database>) => {
    await holdKeys(trx, keys);
    return work(trx);
  };
  return db.isTransaction ? run(db as Transaction<Database>) : db.transaction().execute(run);
}

/** Holds an advisory lock for each key until the transaction `trx` ends (see withKeysHeld). */
export async function holdKeys(trx: Transaction<Database>, keys: readonly string[]): Promise<void> {
  for (const key of [...new Set(keys)].sort()) await sql`SELECT pg_advisory_xact_lock(hashtext(${`held:${key}`}))`.execute(trx);
}
