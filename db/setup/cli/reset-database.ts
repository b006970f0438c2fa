import { databaseUrl } from "../config";
import { ensureDatabase } from "../create-database";

// Drops and recreates the database named by DATABASE_URL. Refuses the dev database by name,
// so the demo data behind `npm start` is never wiped by a test run.
const url = databaseUrl();
const name = new URL(url).pathname.slice(1);
if (!/(_e2e|_test|_it_\d+|_bench\w*)$/.test(name)) {
  console.error(`[reset] refusing to drop "${name}": only *_e2e, *_test, *_bench databases are reset`);
  process.exit(2);
}
await ensureDatabase(url, true);
console.log(`[reset] ${name} is empty`);
