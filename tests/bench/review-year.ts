/**
 * Screens at a year's scale: the review queue (page 1), its count (the menu's badge), the
 * out-of-tolerance filter, the audit page and the audit CSV, on a generated year of a busy shop
 * vs a demo-sized shop, printed as ratios from one run on one machine. The queue is also timed
 * the old way (worked out from every sign-off of the shop: `source "history"`) for comparison.
 * `npx tsx --conditions=react-server tests/bench/review-year.ts` (YEAR_BENCH_JOBS: the year's jobs,
 * 2,008 by default; it takes some minutes: every operation goes through the sync merge and every
 * decision through the review).
 * Figures only, no pass or fail.
 */
import os from "node:os";
import { pathToFileURL } from "node:url";
import { sql, type Kysely } from "kysely";
import { pageAuditLog } from "@/db/audit/read";
import { countReviewQueue, pageReviewQueue, type QueueSource } from "@/db/review/queue";
import type { Database } from "@/db/schema";
import { auditQuerySchema, queueQuerySchema } from "@/lib/review/list-queries";
import { timedCsv } from "./audit-log";
import { spreadAuditOverYear, yearAgoDay, SPREAD_DAYS } from "./back-date";
import { withThrowawayDb } from "./throwaway-db";
import { generateShop, YEAR, type GeneratedShop } from "./year-of-work";

const REPEATS = 15;
const DEMO = { jobs: 6, operationsPerJob: YEAR.operationsPerJob, waiting: 3 };
const YEAR_JOBS = Number(process.env.YEAR_BENCH_JOBS ?? YEAR.jobs);

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function timed(f: () => Promise<unknown>) {
  await f();
  const xs: number[] = [];
  for (let i = 0; i < REPEATS; i++) {
    const t0 = performance.now();
    await f();
    xs.push(performance.now() - t0);
  }
  return median(xs);
}

interface Figures {
  shop: { jobs: number; operations: number; signOffs: number; waiting: number; auditRows: number; outOfTolerance: number };
  queue: Record<QueueSource, { page: number; count: number; outOfTolerance: number }>;
  auditPage: number;
  csv: { ms: number; bytes: number; rows: number };
  yearCsv: { ms: number; bytes: number; rows: number };
}

async function measure(db: Kysely<Database>, g: GeneratedShop): Promise<Figures> {
  const shopId = g.fx.shopId;
  await spreadAuditOverYear(db, shopId);
  await sql`ANALYZE`.execute(db);
  const queue = async (source: QueueSource) => ({
    page: await timed(() => pageReviewQueue(db, shopId, queueQuerySchema.parse({}), source)),
    count: await timed(() => countReviewQueue(db, shopId, source)),
    outOfTolerance: await timed(() => pageReviewQueue(db, shopId, queueQuerySchema.parse({ outOfTolerance: "yes" }), source)),
  });
  const csv = await timedCsv(db, shopId);
  const yearCsv = await timedCsv(db, shopId, { from: yearAgoDay() });
  const audit = await db
    .selectFrom("audit_log")
    .select((eb) => eb.fn.countAll<string>().as("n"))
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
  return {
    shop: {
      jobs: g.workOrderIds.length,
      operations: g.operations,
      signOffs: g.signOffs,
      waiting: await countReviewQueue(db, shopId),
      auditRows: Number(audit?.n ?? 0),
      outOfTolerance: (await pageReviewQueue(db, shopId, queueQuerySchema.parse({ outOfTolerance: "yes" }))).total,
    },
    queue: { waiting: await queue("waiting"), history: await queue("history") },
    auditPage: await timed(() => pageAuditLog(db, shopId, auditQuerySchema.parse({ size: "25" }))),
    csv,
    yearCsv,
  };
}

export async function run() {
  const loadBefore = os.loadavg()[0];
  return withThrowawayDb("year", async (db) => {
    const demo = await measure(db, await generateShop(db, DEMO));
    const t0 = performance.now();
    const year = await generateShop(db, { ...YEAR, jobs: YEAR_JOBS }, (s) => console.log(`  [year] ${s}`));
    const generatedS = (performance.now() - t0) / 1000;
    return {
      demo: demo,
      year: await measure(db, year),
      generatedS,
      loadAverage: { before: loadBefore, after: os.loadavg()[0], cpus: os.cpus().length },
    };
  });
}

export function print(f: Awaited<ReturnType<typeof run>>): void {
  const pad = (s: string | number, n: number) => String(s).padStart(n);
  const { demo, year } = f;
  const shop = (label: string, s: Figures["shop"]) =>
    console.log(
      `${label}: ${s.jobs.toLocaleString("en")} jobs, ${s.operations.toLocaleString("en")} operations, ${s.signOffs.toLocaleString("en")} sign-offs ` +
        `(${s.waiting} waiting, ${s.outOfTolerance} out of tolerance), ${s.auditRows.toLocaleString("en")} audit rows`,
    );
  shop("demo-sized shop", demo.shop);
  shop("a year", year.shop);
  console.log(`(the year made through the merge and the review in ${f.generatedS.toFixed(0)} s)`);
  console.log(
    `\nms, median of ${REPEATS}    ${pad("demo", 9)} ${pad("year", 9)} ${pad("year/demo", 10)} ${pad("old way, year", 14)} ${pad("old/new", 8)}`,
  );
  const line = (label: string, key: keyof Figures["queue"]["waiting"]) => {
    const [a, b, old] = [demo.queue.waiting[key], year.queue.waiting[key], year.queue.history[key]];
    console.log(
      `${label.padEnd(28)} ${pad(a.toFixed(2), 9)} ${pad(b.toFixed(2), 9)} ${pad((b / a).toFixed(1) + "×", 10)} ${pad(old.toFixed(2), 14)} ${pad((old / b).toFixed(1) + "×", 8)}`,
    );
  };
  line("review queue, page 1", "page");
  line("review count (menu)", "count");
  line("out-of-tolerance filter", "outOfTolerance");
  console.log(
    `${"audit page 1 with its count".padEnd(28)} ${pad(demo.auditPage.toFixed(2), 9)} ${pad(year.auditPage.toFixed(2), 9)} ${pad((year.auditPage / demo.auditPage).toFixed(1) + "×", 10)}`,
  );
  const csvLine = (label: string, d: Figures["csv"], y: Figures["csv"]) =>
    console.log(
      `${label.padEnd(28)} ${pad(d.ms.toFixed(0), 9)} ${pad(y.ms.toFixed(0), 9)} ${pad((y.ms / d.ms).toFixed(1) + "×", 10)}` +
        `   (${d.rows.toLocaleString("en")} rows / ${(d.bytes / 1024).toFixed(0)} kB vs ${y.rows.toLocaleString("en")} rows / ${(y.bytes / 1024 / 1024).toFixed(1)} MB)`,
    );
  csvLine("audit CSV, last 30 days", demo.csv, year.csv);
  csvLine("audit CSV, the whole year", demo.yearCsv, year.yearCsv);
  console.log(`(each shop's audit entries spread evenly over the ${SPREAD_DAYS} days before now: the writers stamp them when written)`);
  console.log("Targets at a year's data (printed, not tested): queue, count and filter ≤ 20 ms; audit page ≤ 20 ms.");
  console.log(
    `load average ${f.loadAverage.before.toFixed(2)} → ${f.loadAverage.after.toFixed(2)} on ${f.loadAverage.cpus} cpus (other work inflates every figure)`,
  );
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  print(await run());
  process.exit(0);
}
