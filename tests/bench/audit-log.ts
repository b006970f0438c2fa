/**
 * Audit log benchmark: the audit page (one page, with its capped count) and the CSV download on a
 * large generated log, as ratios against a demo-sized one, from one run on one machine.
 * `npx tsx --conditions=react-server tests/bench/audit-log.ts` (AUDIT_BENCH_ROWS: the large log's
 * size, 220,000 by default, about a year of a busy shop; the demo shop's log holds about 90).
 *
 * Both logs are written by the app's own writer (appendAudit), into their own shops of one
 * throwaway database, then spread over the year before today (back-date.ts: the writer stamps
 * each entry when it is written), so the CSV's default range (the last 30 days) holds about a
 * twelfth of each log; the whole year's download is measured too. Figures only, no pass or fail.
 */
import os from "node:os";
import { pathToFileURL } from "node:url";
import type { Kysely } from "kysely";
import { auditCsvResponse } from "@/app/_server/audit-csv-response";
import { spreadAuditOverYear, yearAgoDay, SPREAD_DAYS } from "./back-date";
import { appendAudit, type AuditEntry } from "@/db/audit/append";
import { pageAuditLog } from "@/db/audit/read";
import type { Database } from "@/db/schema";
import { auditExportSchema } from "@/lib/review/audit-range";
import { auditQuerySchema } from "@/lib/review/list-queries";
import { createShopFixture } from "../integration/support/shop-fixture";
import { withThrowawayDb } from "./throwaway-db";

const DEMO_ROWS = 90;
const LARGE_ROWS = Number(process.env.AUDIT_BENCH_ROWS ?? 220_000);
const PAGE_REPEATS = 15;
const ACTIONS = ["sync.measurement.recorded", "sync.step.completed", "sync.timer.started", "review.approve", "office.work-order.moved"];

interface LogFigures {
  rows: number;
  pageMs: number;
  jobPageMs: number;
  deepPageMs: number;
  filteredPageMs: number;
  csvMs: number;
  csvBytes: number;
  csvRows: number;
  yearCsvMs: number;
  yearCsvBytes: number;
  yearCsvRows: number;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function fill(db: Kysely<Database>, n: number) {
  const fx = await createShopFixture(db);
  for (let i = 0; i < n; i += 2_000) {
    const entries: AuditEntry[] = Array.from({ length: Math.min(2_000, n - i) }, (_, k) => {
      const j = i + k;
      return {
        shopId: fx.shopId,
        actorId: j % 5 === 4 ? fx.users.office.id : fx.users.mechanic.id,
        deviceId: j % 5 === 4 ? null : `bay-${j % 4}`,
        action: ACTIONS[j % ACTIONS.length],
        entity: "operation",
        entityId: String(j),
        workOrderId: j % 3 === 0 ? fx.workOrderId : null,
        outcome: j % 50 === 0 ? "refused" : "accepted",
        reason: j % 50 === 0 ? "Reading out of the range the gauge can show" : null,
        detail: { value: (76 + (j % 10) / 1000).toFixed(3), index: j % 6 },
      };
    });
    await appendAudit(db, entries);
  }
  return fx;
}

async function timed(f: () => Promise<unknown>) {
  const xs: number[] = [];
  for (let i = 0; i < PAGE_REPEATS; i++) {
    const t0 = performance.now();
    await f();
    xs.push(performance.now() - t0);
  }
  return median(xs);
}

/** The CSV download, read to its end: by default the last 30 days; `{ from: "YYYY-MM-DD" }` for longer. */
export async function timedCsv(db: Kysely<Database>, shopId: string, range: { from?: string } = {}) {
  const t0 = performance.now();
  const res = auditCsvResponse(db, shopId, auditExportSchema().parse(range));
  let bytes = 0;
  let lines = 0;
  const reader = res.body!.getReader();
  for (let r = await reader.read(); !r.done; r = await reader.read()) {
    bytes += r.value.byteLength;
    for (const b of r.value) if (b === 10) lines++;
  }
  return { ms: performance.now() - t0, bytes, rows: lines - 1 };
}

async function measure(db: Kysely<Database>, n: number): Promise<LogFigures> {
  const fx = await fill(db, n);
  await spreadAuditOverYear(db, fx.shopId);
  const page = (q: Record<string, string>) => () => pageAuditLog(db, fx.shopId, auditQuerySchema.parse({ size: "25", ...q }));
  const csv = await timedCsv(db, fx.shopId);
  const yearCsv = await timedCsv(db, fx.shopId, { from: yearAgoDay() });
  return {
    rows: n,
    pageMs: await timed(page({})),
    jobPageMs: await timed(page({ job: "1" })),
    deepPageMs: await timed(page({ page: "20" })),
    filteredPageMs: await timed(page({ outcome: "refused" })),
    csvMs: csv.ms,
    csvBytes: csv.bytes,
    csvRows: csv.rows,
    yearCsvMs: yearCsv.ms,
    yearCsvBytes: yearCsv.bytes,
    yearCsvRows: yearCsv.rows,
  };
}

export async function run() {
  const loadBefore = os.loadavg()[0];
  return withThrowawayDb("audit", async (db) => {
    await measure(db, DEMO_ROWS); // warm-up: pool, plans, JIT
    const demo = await measure(db, DEMO_ROWS);
    const large = await measure(db, LARGE_ROWS);
    return { demo, large, loadAverage: { before: loadBefore, after: os.loadavg()[0], cpus: os.cpus().length } };
  });
}

export function print(f: Awaited<ReturnType<typeof run>>): void {
  const pad = (s: string | number, n: number) => String(s).padStart(n);
  const { demo, large } = f;
  console.log(`\nAudit log: ${large.rows.toLocaleString("en")} entries vs the demo's ${demo.rows} (median of ${PAGE_REPEATS}; ms)`);
  console.log(`${"".padEnd(34)} ${pad("demo", 9)} ${pad("large", 9)} ${pad("large/demo", 11)}`);
  const line = (label: string, a: number, b: number) =>
    console.log(`${label.padEnd(34)} ${pad(a.toFixed(2), 9)} ${pad(b.toFixed(2), 9)} ${pad((b / a).toFixed(1) + "×", 11)}`);
  line("page 1, newest first, with count", demo.pageMs, large.pageMs);
  line("page 1 of one job", demo.jobPageMs, large.jobPageMs);
  line("page 21 (offset 500)", demo.deepPageMs, large.deepPageMs);
  line("page 1 of refused entries", demo.filteredPageMs, large.filteredPageMs);
  const csvLine = (label: string, ms: [number, number], rows: [number, number], bytes: [number, number]) => {
    line(label, ms[0], ms[1]);
    console.log(
      `  ${rows[0]} rows / ${(bytes[0] / 1024).toFixed(1)} kB vs ${rows[1].toLocaleString("en")} rows / ${(bytes[1] / 1024 / 1024).toFixed(1)} MB; ` +
        `time per row large/demo ${(ms[1] / rows[1] / (ms[0] / rows[0])).toFixed(2)}×`,
    );
  };
  csvLine("CSV download, last 30 days (ms)", [demo.csvMs, large.csvMs], [demo.csvRows, large.csvRows], [demo.csvBytes, large.csvBytes]);
  csvLine(
    "CSV download, the whole year (ms)",
    [demo.yearCsvMs, large.yearCsvMs],
    [demo.yearCsvRows, large.yearCsvRows],
    [demo.yearCsvBytes, large.yearCsvBytes],
  );
  console.log(`(each log spread evenly over the ${SPREAD_DAYS} days before now, so a year's download, today included, holds it all)`);
  console.log(
    `load average ${f.loadAverage.before.toFixed(2)} → ${f.loadAverage.after.toFixed(2)} on ${f.loadAverage.cpus} cpus (other work inflates every figure)`,
  );
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  print(await run());
  process.exit(0);
}
