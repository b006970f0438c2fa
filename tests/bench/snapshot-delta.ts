/**
 * Snapshot traffic per sync: the bytes a tablet downloads for a job it holds a copy of, when each
 * sync brings a little new work, for a demo-sized job and a large one (2,000 operations by default,
 * SNAPSHOT_BENCH_OPERATIONS), through the route (GET /api/bench/jobs/[id]) as the tablet calls it.
 * Whole copy every time (before) vs only what changed (a delta; "unchanged" when nothing did), and whether
 * each delta, applied, gave exactly the record's copy.
 * `npx tsx --conditions=react-server tests/bench/snapshot-delta.ts`. Figures only, no pass or fail.
 */
import { pathToFileURL } from "node:url";
import type { Kysely } from "kysely";
import { GET as jobCopy } from "@/app/api/bench/jobs/[id]/route";
import type { Database } from "@/db/schema";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { jobSnapshotSchema, type JobSnapshot } from "@/lib/sync/snapshot";
import { applySnapshotDelta, sectionDigests, snapshotDeltaSchema, snapshotDigest } from "@/lib/sync/snapshot-delta";
import { createShopFixture } from "../integration/support/shop-fixture";
import { backlog, fixtureSpecs, Tablet } from "./sync-ops";
import { withThrowawayDb } from "./throwaway-db";

const LARGE = Number(process.env.SNAPSHOT_BENCH_OPERATIONS ?? 2_000);
const DEMO = 40;
const SYNCS = 10;
const PER_SYNC = 12;

async function get(db: Kysely<Database>, user: SessionUser, id: string, held?: JobSnapshot) {
  const headers: Record<string, string> = {};
  if (held) {
    const have = await sectionDigests(held);
    Object.assign(headers, {
      "if-none-match": `"${await snapshotDigest(have)}"`,
      "x-bench-since": held.cursor,
      "x-bench-have": have.join("."),
    });
  }
  const res = await jobCopy.handle(new Request(`http://bench.local/api/bench/jobs/${id}`, { headers }), { user, db, params: { id } });
  const text = await res.text();
  return { status: res.status, text, bytes: Buffer.byteLength(text), body: JSON.parse(text) as { cursor: string; unchanged?: true } };
}

async function job(db: Kysely<Database>, operations: number) {
  const fx = await createShopFixture(db);
  const specs = await fixtureSpecs(db, fx);
  const user: SessionUser = { ...fx.users.mechanic, customerId: null };
  const tablet = new Tablet("bay-1", user.id, fx.workOrderId);
  for (let i = 0; i < operations; i += 1_000)
    await mergeBatch(db, user, tablet.batch(backlog(tablet, specs, Math.min(1_000, operations - i))));
  const id = fx.workOrderId;
  const first = await get(db, user, id);
  let held = jobSnapshotSchema.parse(JSON.parse(first.text));
  const whole: number[] = [];
  const delta: number[] = [];
  let exact = 0;
  for (let s = 0; s < SYNCS; s++) {
    // a sync with nothing new on this job, then one with a few readings, bolts and completions
    const unchanged = await get(db, user, id, held);
    if (unchanged.body.unchanged) held = { ...held, cursor: unchanged.body.cursor };
    else throw new Error("a sync with nothing new in the job did not answer unchanged");
    await mergeBatch(db, user, tablet.batch(backlog(tablet, specs, PER_SYNC)));
    whole.push((await get(db, user, id)).bytes);
    const d = await get(db, user, id, held);
    delta.push(d.bytes);
    const parsed = snapshotDeltaSchema.parse(JSON.parse(d.text)).delta;
    const next = jobSnapshotSchema.parse(applySnapshotDelta(held, parsed));
    if ((await snapshotDigest(await sectionDigests(next))) === parsed.digest) exact++;
    held = next;
  }
  const avg = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
  return { operations, first: first.bytes, whole: avg(whole), delta: avg(delta), deltaMax: Math.max(...delta), exact };
}

export async function run() {
  return withThrowawayDb("snapshot", async (db) => ({ demo: await job(db, DEMO), large: await job(db, LARGE) }));
}

export function print(f: Awaited<ReturnType<typeof run>>): void {
  const kB = (n: number) => `${(n / 1024).toFixed(1)} kB`.padStart(10);
  console.log(
    `\nSnapshot bytes per sync (${SYNCS} syncs of ${PER_SYNC} new operations each; a sync with nothing new in the job answers "unchanged", about 50 bytes)`,
  );
  console.log(
    `${"job".padEnd(26)} ${"first copy".padStart(10)} ${"whole/sync".padStart(10)} ${"delta/sync".padStart(10)} ${"delta max".padStart(10)} ${"whole/delta".padStart(12)}  exact`,
  );
  for (const [label, r] of [
    [`demo-sized (${f.demo.operations} operations)`, f.demo],
    [`large (${f.large.operations.toLocaleString("en")} operations)`, f.large],
  ] as const)
    console.log(
      `${label.padEnd(26)} ${kB(r.first)} ${kB(r.whole)} ${kB(r.delta)} ${kB(r.deltaMax)} ${`${(r.whole / r.delta).toFixed(0)}×`.padStart(12)}  ${r.exact}/${SYNCS}`,
    );
  console.log("Target (printed, not tested): ≤ 20 kB per sync after the first for a job with 2,000 operations.");
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  print(await run());
  process.exit(0);
}
