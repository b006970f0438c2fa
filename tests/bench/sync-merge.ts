/**
 * Sync merge benchmark: `npx tsx --conditions=react-server tests/bench/sync-merge.ts` (server modules load only under that condition)
 *
 * Uses the test cluster (db/scripts/pg.sh start test) and a throwaway database, migrated, with a
 * fixture shop. Measures, in one run, side by side on the same machine:
 *   - mergeBatch for batches of 100, 1,000 and 10,000 operations (median of 3 runs);
 *   - PostgreSQL's COPY of the same number of operation rows (the operations as they arrive, into
 *     a scratch table keyed by id), and COPY of exactly the rows the merge wrote (its operations,
 *     read-table rows and audit entries, read back after the merge, into scratch tables made
 *     LIKE the real ones: same columns, indexes and checks, no foreign keys or triggers);
 *   - a 10,000-operation backlog: a tablet back from a long dropout posts its 10,000-operation
 *     outbox through the HTTP handler (JSON + zod + merge) and pulls the 10,000 operations another
 *     tablet sent meanwhile, page by page until `more` is false.
 * Prints figures and ratios only: no threshold, no pass or fail (they move with machine load).
 */
import { execFileSync } from "node:child_process";
import os from "node:os";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { sql, type Kysely } from "kysely";
import { createDb } from "@/db/setup/client";
import { copyRows } from "@/db/setup/copy-rows";
import { ensureDatabase } from "@/db/setup/create-database";
import { migrateToLatest } from "@/db/setup/migrate";
import type { Database } from "@/db/schema";
import { mergeBatch } from "@/db/sync/merge";
import { POST as syncRoute } from "@/app/api/sync/route";
import type { SessionUser } from "@/lib/auth/session-user";
import type { SyncResponse } from "@/lib/sync/changes";
import type { Operation } from "@/lib/sync/operations";
import { createShopFixture } from "../integration/support/shop-fixture";
import { backlog, fixtureSpecs, Tablet } from "./sync-ops";

const SIZES = [100, 1_000, 10_000];
const REPEATS = 3;

export interface SizeFigures {
  operations: number;
  mergeMs: number;
  /** COPY of the same number of operation rows (as they arrive). */
  copySameMs: number;
  /** COPY of exactly the rows the merge wrote, and how many that is. */
  copyWrittenMs: number;
  writtenRows: number;
}
export interface BenchFigures {
  sizes: SizeFigures[];
  backlog: { sentOperations: number; receivedChanges: number; requests: number; ms: number };
  /** 1-minute load average before and after (other work on the machine inflates every figure). */
  loadAverage: { before: number; after: number; cpus: number };
  /** The cluster's durability settings (the test cluster runs with both off; COPY is measured on the same cluster). */
  durability: { fsync: string; synchronousCommit: string };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function testDatabaseUrl(): Promise<string> {
  if (process.env.TEST_DATABASE_URL) return process.env.TEST_DATABASE_URL;
  const script = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../../db/scripts/pg.sh");
  const env = { ...process.env };
  delete env.DATABASE_URL;
  execFileSync("bash", [script, "start", "test"], { stdio: "inherit", env });
  const base = execFileSync("bash", [script, "url", "test"], { env }).toString().trim();
  return `${base}/benchtag_bench_sync_${process.pid}`;
}

async function newJob(db: Kysely<Database>) {
  const fx = await createShopFixture(db);
  const specs = await fixtureSpecs(db, fx);
  const user: SessionUser = { ...fx.users.mechanic, customerId: null };
  const sup: SessionUser = { ...fx.users.supervisor, customerId: null };
  return { fx, specs, user, sup };
}

const operationColumns = ["id", "work_order_id", "kind", "author_id", "device_id", "device_time", "stamp", "payload"];

/** COPY of the same number of operation rows, as they arrive, into a scratch table keyed by id. */
async function copySame(db: Kysely<Database>, ops: Operation[]): Promise<number> {
  await sql`DROP TABLE IF EXISTS bench_scratch`.execute(db);
  await sql`CREATE TABLE bench_scratch (id uuid PRIMARY KEY, work_order_id uuid, kind text, author_id uuid, device_id text,
    device_time timestamptz, stamp text, payload jsonb)`.execute(db);
  const rows = ops.map((o) => [o.id, o.workOrderId, o.kind, o.authorId, o.deviceId, o.deviceTime, o.stamp, o.payload]);
  const t0 = performance.now();
  await db.transaction().execute((trx) => copyRows(trx, "bench_scratch", operationColumns, rows));
  return performance.now() - t0;
}

// The tables a backlog's operations are written to (with the audit log); each row's key names its operation.
const writtenTables = [
  { table: "operations", key: "id" },
  { table: "measurements", key: "id" },
  { table: "torque_records", key: "id" },
  { table: "step_completions", key: "id" },
  { table: "audit_log", key: "entity_id" },
] as const;

/**
 * COPY of exactly the rows the merge wrote for `ids`: read back from each table, then copied (the
 * timed part) into scratch tables LIKE the real ones (columns, defaults, checks and indexes; LIKE
 * copies no foreign keys and no triggers). Returns the time and the number of rows.
 */
async function copyWritten(db: Kysely<Database>, ids: string[]): Promise<{ ms: number; rows: number }> {
  const loaded: { scratch: string; columns: string[]; rows: unknown[][] }[] = [];
  for (const { table, key } of writtenTables) {
    const scratch = `bench_scratch_${table}`;
    await sql`DROP TABLE IF EXISTS ${sql.table(scratch)}`.execute(db);
    await sql`CREATE TABLE ${sql.table(scratch)} (LIKE ${sql.table(table)} INCLUDING ALL)`.execute(db);
    const r = await sql<
      Record<string, unknown>
    >`SELECT * FROM ${sql.table(table)} WHERE ${sql.ref(key)}::text = ANY(${ids}::text[])`.execute(db);
    if (!r.rows.length) continue;
    const columns = Object.keys(r.rows[0]);
    loaded.push({ scratch, columns, rows: r.rows.map((row) => columns.map((c) => row[c])) });
  }
  const t0 = performance.now();
  await db.transaction().execute(async (trx) => {
    for (const l of loaded) await copyRows(trx, l.scratch, l.columns, l.rows);
  });
  return { ms: performance.now() - t0, rows: loaded.reduce((n, l) => n + l.rows.length, 0) };
}

export async function run(): Promise<BenchFigures> {
  const loadBefore = os.loadavg()[0];
  const url = await testDatabaseUrl();
  await ensureDatabase(url, true);
  const db = createDb(url, 4);
  try {
    await migrateToLatest(db);
    // warm up (JIT, pool, plans)
    {
      const w = await newJob(db);
      const t = new Tablet("warm-up", w.user.id, w.fx.workOrderId);
      await mergeBatch(db, w.user, t.batch(backlog(t, w.specs, 500)));
    }

    const sizes: SizeFigures[] = [];
    for (const n of SIZES) {
      const mergeTimes: number[] = [];
      const sameTimes: number[] = [];
      const writtenTimes: number[] = [];
      let writtenRows = 0;
      for (let r = 0; r < REPEATS; r++) {
        const job = await newJob(db);
        const tablet = new Tablet(`bench-${n}-${r}`, job.user.id, job.fx.workOrderId);
        const ops = backlog(tablet, job.specs, n);
        const t0 = performance.now();
        const res = await mergeBatch(db, job.user, tablet.batch(ops));
        mergeTimes.push(performance.now() - t0);
        if (res.accepted.length !== n)
          throw new Error(`expected ${n} accepted, got ${res.accepted.length} (refused: ${JSON.stringify(res.refused.slice(0, 3))})`);
        sameTimes.push(await copySame(db, ops));
        const written = await copyWritten(
          db,
          ops.map((o) => o.id),
        );
        writtenTimes.push(written.ms);
        writtenRows = written.rows;
      }
      sizes.push({
        operations: n,
        mergeMs: median(mergeTimes),
        copySameMs: median(sameTimes),
        copyWrittenMs: median(writtenTimes),
        writtenRows,
      });
    }

    // the backlog: bay-2 was offline while bay-1 sent 10,000 operations; it comes back with its own 10,000
    const job = await newJob(db);
    const bay1 = new Tablet("bay-1", job.user.id, job.fx.workOrderId);
    const bay2 = new Tablet("bay-2", job.sup.id, job.fx.workOrderId);
    const start = await mergeBatch(db, job.sup, bay2.batch([], null));
    await mergeBatch(db, job.user, bay1.batch(backlog(bay1, job.specs, 10_000)));
    const outbox = backlog(bay2, job.specs, 10_000);
    let cursor: string | null = start.cursor;
    let received = 0;
    let requests = 0;
    const t0 = performance.now();
    let body: Operation[] = outbox;
    for (;;) {
      const request = new Request("http://bench.local/api/sync", {
        method: "POST",
        headers: { "content-type": "application/json", origin: "http://bench.local" },
        body: JSON.stringify(bay2.batch(body, cursor)),
      });
      const res = await syncRoute.handle(request, { user: job.sup, db });
      requests += 1;
      if (res.status !== 200) throw new Error(`catch-up request answered ${res.status}: ${await res.text()}`);
      const answer = (await res.json()) as SyncResponse;
      received += answer.changes.length;
      cursor = answer.cursor;
      body = [];
      if (!answer.more) break;
    }
    const ms = performance.now() - t0;

    return {
      sizes,
      backlog: { sentOperations: outbox.length, receivedChanges: received, requests, ms },
      loadAverage: { before: loadBefore, after: os.loadavg()[0], cpus: os.cpus().length },
      durability: (
        await sql<{ fsync: string; synchronousCommit: string }>`
          SELECT current_setting('fsync') AS fsync, current_setting('synchronous_commit') AS "synchronousCommit"`.execute(db)
      ).rows[0],
    };
  } finally {
    await db.destroy();
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
  }
}

export function print(f: BenchFigures): void {
  const pad = (s: string | number, n: number) => String(s).padStart(n);
  const pct = (copyMs: number, mergeMs: number) => `${((copyMs / mergeMs) * 100).toFixed(0)} %`;
  console.log("\nSync merge (mergeBatch, one transaction per batch; median of 3) against PostgreSQL's COPY");
  console.log("  same rows: COPY of as many operation rows as the batch holds (as they arrive)");
  console.log("  written rows: COPY of exactly the rows the merge wrote (operations, read-table rows, audit entries)");
  console.log("  merge rate as a share of COPY's = COPY time / merge time");
  console.log(
    `${pad("operations", 11)} ${pad("merge ms", 9)} ${pad("merge ops/s", 12)} ${pad("COPY same ms", 13)} ${pad("merge/COPY same", 16)} ${pad("rows written", 13)} ${pad("COPY written ms", 16)} ${pad("merge/COPY written", 19)}`,
  );
  for (const s of f.sizes) {
    console.log(
      `${pad(s.operations.toLocaleString("en"), 11)} ${pad(s.mergeMs.toFixed(1), 9)} ${pad(Math.round((s.operations / s.mergeMs) * 1000).toLocaleString("en"), 12)} ${pad(s.copySameMs.toFixed(1), 13)} ${pad(pct(s.copySameMs, s.mergeMs), 16)} ${pad(s.writtenRows.toLocaleString("en"), 13)} ${pad(s.copyWrittenMs.toFixed(1), 16)} ${pad(pct(s.copyWrittenMs, s.mergeMs), 19)}`,
    );
  }
  const ten = f.sizes.find((s) => s.operations === 10_000);
  if (ten) console.log(`\n10,000-operation backlog merged (mergeBatch): ${ten.mergeMs.toFixed(0)} ms`);
  const b = f.backlog;
  console.log(
    `10,000-operation backlog through the HTTP handler: sent ${b.sentOperations.toLocaleString("en")} operations, received ${b.receivedChanges.toLocaleString("en")} changes in ${b.requests} requests: ${b.ms.toFixed(0)} ms`,
  );
  const l = f.loadAverage;
  console.log(`Machine: ${l.cpus} CPUs, load average ${l.before.toFixed(1)} before / ${l.after.toFixed(1)} after`);
  console.log(
    `PostgreSQL: fsync ${f.durability.fsync}, synchronous_commit ${f.durability.synchronousCommit} ` +
      `(the scripts' test cluster runs with both off; TEST_DATABASE_URL can name a database on a cluster that has them on)\n`,
  );
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  run()
    .then(print)
    .catch((e) => {
      console.error(e);
      process.exitCode = 1;
    });
}
