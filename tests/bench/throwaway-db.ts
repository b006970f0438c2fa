// A throwaway database on the test cluster for a benchmark: created and migrated on the way in,
// dropped on the way out (unless TEST_DATABASE_URL names one, or KEEP_TEST_DB is set).
import { execFileSync } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";
import type { Kysely } from "kysely";
import type { Database } from "@/db/schema";
import { createDb } from "@/db/setup/client";
import { ensureDatabase } from "@/db/setup/create-database";
import { migrateToLatest } from "@/db/setup/migrate";

export async function withThrowawayDb<T>(name: string, body: (db: Kysely<Database>) => Promise<T>): Promise<T> {
  let url = process.env.TEST_DATABASE_URL;
  if (!url) {
    const script = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../../db/scripts/pg.sh");
    const env = { ...process.env };
    delete env.DATABASE_URL;
    execFileSync("bash", [script, "start", "test"], { stdio: "inherit", env });
    url = `${execFileSync("bash", [script, "url", "test"], { env }).toString().trim()}/benchtag_bench_${name}_${process.pid}`;
  }
  await ensureDatabase(url, true);
  const db = createDb(url, 4);
  try {
    await migrateToLatest(db);
    return await body(db);
  } finally {
    await db.destroy();
    if (!process.env.TEST_DATABASE_URL && !process.env.KEEP_TEST_DB) {
      const { default: pg } = await import("pg");
      const admin = new URL(url);
      const dbName = admin.pathname.slice(1);
      admin.pathname = "/postgres";
      const c = new pg.Client({ connectionString: admin.toString() });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS ${dbName} WITH (FORCE)`);
      await c.end();
    }
  }
}
