/**
 * Sync merge benchmark: `npx tsx --conditions=react-server tests/bench/sync-merge.ts` (server modules load only under that condition)
 *
 * Uses the test cluster (db/scripts/pg.sh start test) and a throwaway database, migrated, with a
 * fixture shop. Measures:
 *   - mergeBatch throughput for batches of 100, 1,000 and 10,000 operations (median of 3 runs),
 *     and beside it PostgreSQL's raw multi-row INSERT rate for the same rows into a scratch table;
 *   - a 10,000-operation catch-up: a tablet back from a long dropout posts its 10,000-operation
 *     outbox through the HTTP handler (JSON + zod + merge) and pulls the 10,000 operations another
 *     tablet sent meanwhile, page by page until `more` is false.
 * Reports figures only (no thresholds), and whether 10,000 operations merged in under 2 s.
 */
import { execFileSync } from "node:child_process";
import os from "node:os";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { sql, type Kysely } from "kysely";
import { createDb } from "@/db/setup/client";
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
  mergeOpsPerS: number;
  rawInsertMs: number;
  rawRowsPerS: number;
}
export interface BenchFigures {
  sizes: SizeFigures[];
  catchUp: { sentOperations: number; receivedChanges: number; requests: number; ms: number; opsPerS: number };
  tenThousandUnder2s: boolean;
  /** 1-minute load average before and after (other work on the machine inflates every figure). */
  loadAverage: { before: number; after: number; cpus: number };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const rate = (n: number, ms: number) => Math.round((n / ms) * 1000);

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

/** PostgreSQL's own rate for the same rows: plain multi-row INSERTs (8 columns, 5,000 rows a statement). */
async function rawInsert(db: Kysely<Database>, ops: Operation[]): Promise<number> {
  await sql`DROP TABLE IF EXISTS bench_scratch`.execute(db);
  await sql`CREATE TABLE bench_scratch (id uuid PRIMARY KEY, work_order_id uuid, kind text, author_id uuid, device_id text,
    device_time timestamptz, stamp text, payload jsonb)`.execute(db);
  const t0 = performance.now();
  await db.transaction().execute(async (trx) => {
    for (let i = 0; i < ops.length; i += 5_000) {
      const chunk = ops.slice(i, i + 5_000);
      await sql`INSERT INTO bench_scratch (id, work_order_id, kind, author_id, device_id, device_time, stamp, payload) VALUES ${sql.join(
        chunk.map(
          (o) =>
            sql`(${o.id}, ${o.workOrderId}, ${o.kind}, ${o.authorId}, ${o.deviceId}, ${o.deviceTime}, ${o.stamp}, ${JSON.stringify(o.payload)})`,
        ),
      )}`.execute(trx);
    }
  });
  return performance.now() - t0;
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
      const rawTimes: number[] = [];
      for (let r = 0; r < REPEATS; r++) {
        const job = await newJob(db);
        const tablet = new Tablet(`bench-${n}-${r}`, job.user.id, job.fx.workOrderId);
        const ops = backlog(tablet, job.specs, n);
        const t0 = performance.now();
        const res = await mergeBatch(db, job.user, tablet.batch(ops));
        mergeTimes.push(performance.now() - t0);
        if (res.accepted.length !== n)
          throw new Error(`expected ${n} accepted, got ${res.accepted.length} (refused: ${JSON.stringify(res.refused.slice(0, 3))})`);
        rawTimes.push(await rawInsert(db, ops));
      }
      const mergeMs = median(mergeTimes);
      const rawInsertMs = median(rawTimes);
      sizes.push({ operations: n, mergeMs, mergeOpsPerS: rate(n, mergeMs), rawInsertMs, rawRowsPerS: rate(n, rawInsertMs) });
    }

    // catch-up: bay-2 was offline while bay-1 sent 10,000 operations; it comes back with its own 10,000
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

    const ten = sizes.find((s) => s.operations === 10_000)!;
    return {
      sizes,
      catchUp: { sentOperations: outbox.length, receivedChanges: received, requests, ms, opsPerS: rate(outbox.length + received, ms) },
      tenThousandUnder2s: ten.mergeMs < 2_000,
      loadAverage: { before: loadBefore, after: os.loadavg()[0], cpus: os.cpus().length },
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
  console.log("\nSync merge (mergeBatch, one transaction per batch; median of 3) vs raw multi-row INSERT of the same rows");
  console.log(
    `${pad("operations", 11)} ${pad("merge ms", 10)} ${pad("merge ops/s", 12)} ${pad("raw ms", 9)} ${pad("raw rows/s", 11)} ${pad("merge/raw", 10)}`,
  );
  for (const s of f.sizes) {
    console.log(
      `${pad(s.operations.toLocaleString("en"), 11)} ${pad(s.mergeMs.toFixed(1), 10)} ${pad(s.mergeOpsPerS.toLocaleString("en"), 12)} ${pad(s.rawInsertMs.toFixed(1), 9)} ${pad(s.rawRowsPerS.toLocaleString("en"), 11)} ${pad((s.mergeMs / s.rawInsertMs).toFixed(1) + "×", 10)}`,
    );
  }
  const c = f.catchUp;
  console.log(
    `\nCatch-up through the HTTP handler: sent ${c.sentOperations.toLocaleString("en")} operations, received ${c.receivedChanges.toLocaleString("en")} changes in ${c.requests} requests: ${c.ms.toFixed(0)} ms (${c.opsPerS.toLocaleString("en")} ops/s both ways)`,
  );
  console.log(`10,000 operations merged in under 2 s: ${f.tenThousandUnder2s ? "yes" : "NO"}`);
  const l = f.loadAverage;
  console.log(`Machine: ${l.cpus} CPUs, load average ${l.before.toFixed(1)} before / ${l.after.toFixed(1)} after\n`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  run()
    .then(print)
    .catch((e) => {
      console.error(e);
      process.exitCode = 1;
    });
}
