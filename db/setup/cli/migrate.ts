import { createDb } from "../client";
import { databaseUrl } from "../config";
import { ensureDatabase } from "../create-database";
import { migrateToLatest } from "../migrate";

const url = databaseUrl();
await ensureDatabase(url);
const db = createDb(url, 1);
try {
  const ran = await migrateToLatest(db);
  console.log(ran.length ? `[migrate] applied ${ran.join(", ")}` : "[migrate] up to date");
} finally {
  await db.destroy();
}
