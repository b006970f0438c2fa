import { afterAll, inject } from "vitest";
import { createDb } from "@/db/setup/client";

// A Kysely instance on this run's clean database, closed after the file's tests.
export function useTestDb() {
  const db = createDb(inject("databaseUrl"), 5);
  afterAll(async () => {
    await db.destroy();
  });
  return db;
}
