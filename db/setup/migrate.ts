import { Migrator, type Kysely } from "kysely";
import { migrations } from "../migrations";
import type { Database } from "../schema";

// Runs every pending migration with Kysely's Migrator; throws naming the failing migration.
export async function migrateToLatest(db: Kysely<Database>): Promise<string[]> {
  const migrator = new Migrator({ db, provider: { getMigrations: async () => migrations } });
  const { error, results } = await migrator.migrateToLatest();
  const failed = results?.find((r) => r.status === "Error");
  if (error || failed) {
    throw new Error(`migration ${failed?.migrationName ?? "?"} failed: ${String(error)}`);
  }
  return (results ?? []).map((r) => r.migrationName);
}
