import { execFileSync } from "node:child_process";
import path from "node:path";
import type { TestProject } from "vitest/node";
import { createDb } from "@/db/setup/client";
import { ensureDatabase } from "@/db/setup/create-database";
import { migrateToLatest } from "@/db/setup/migrate";

// Each integration run gets a clean database on the test cluster (port 54339, fsync off),
// started here when DATABASE_URL is not given. TEST_DATABASE_URL overrides the whole thing.
export default async function setup(project: TestProject) {
  let url = process.env.TEST_DATABASE_URL;
  if (!url) {
    const script = path.resolve(import.meta.dirname, "../../db/scripts/pg.sh");
    const env = { ...process.env };
    delete env.DATABASE_URL;
    execFileSync("bash", [script, "start", "test"], { stdio: "inherit", env });
    const base = execFileSync("bash", [script, "url", "test"], { env }).toString().trim();
    url = `${base}/benchtag_it_${process.pid}`;
  }
  await ensureDatabase(url, true);
  const db = createDb(url, 1);
  try {
    await migrateToLatest(db);
  } finally {
    await db.destroy();
  }
  project.provide("databaseUrl", url);
  return async () => {
    if (!process.env.TEST_DATABASE_URL && !process.env.KEEP_TEST_DB) {
      const { default: pg } = await import("pg");
      const admin = new URL(url);
      const name = admin.pathname.slice(1);
      admin.pathname = "/postgres";
      const c = new pg.Client({ connectionString: admin.toString() });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      await c.end();
    }
  };
}

declare module "vitest" {
  export interface ProvidedContext {
    databaseUrl: string;
  }
}
