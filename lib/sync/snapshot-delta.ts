/**
 * A job's copy brought up to date with only what changed (GET /api/bench/jobs/[id]?since=&have=).
 * Pure, shared by the server (which builds the delta) and the tablet (which applies it).
 *
 * A copy is cut into sections (the work order, the bike, the people, the procedures, and each list
 * of recorded work). Each section has a digest: SHA-256 of its JSON with keys in sorted order
 * (fast-json-stable-stringify), 16 hex digits; the copy's digest is the digest of its sections'
 * digests, and is the snapshot's ETag. The tablet sends the cursor its copy is current to (`since`)
 * and its sections' digests (`have`); the server answers `{ cursor, unchanged: true }` when the
 * copy's digest is the same as the record's, else `{ cursor, delta }`:
 *  - a section whose digest differs is sent whole, except the lists that only grow and whose entries
 *    do not change once recorded (completions, readings, torque, sign-offs, withdrawals, decisions):
 *    of those only the entries recorded after `since` come, each with its place in the list, and the
 *    reading that was current on a spot where a new one came (it may no longer be);
 *    the latest decision on a sign-off replaces the one held;
 *  - the record's digest and cursor.
 * The tablet applies it to its copy, checks that the result has the record's digest, and only then
 * stores it; a result that differs (or any doubt) is answered by fetching the whole copy.
 */
import stringify from "fast-json-stable-stringify";
import { z } from "zod";
import { cursorSchema } from "./operations";
import type { JobSnapshot } from "./snapshot";

type State = JobSnapshot["state"];

/** The sections of a copy, in the order their digests are sent. */
export const SNAPSHOT_SECTIONS = [
  "workOrder",
  "bike",
  "people",
  "procedures",
  "completions",
  "readings",
  "torqueRecords",
  "timers",
  "signOffs",
  "reviewDecisions",
  "photos",
  "parts",
  "withdrawals",
  "clocks",
] as const;
export type SnapshotSection = (typeof SNAPSHOT_SECTIONS)[number];

const HEAD = new Set<SnapshotSection>(["workOrder", "bike", "people", "procedures"]);

/** The lists sent entry by entry, and the field that names an entry (one decision per sign-off: the latest). */
export const ROW_LISTS = {
  completions: "id",
  readings: "id",
  torqueRecords: "id",
  signOffs: "id",
  withdrawals: "id",
  reviewDecisions: "signOffId",
} as const satisfies Partial<Record<keyof State, string>>;
export type RowList = keyof typeof ROW_LISTS;
const isRowList = (s: SnapshotSection): s is RowList => s in ROW_LISTS;

const DIGEST = /^[0-9a-f]{16}$/;

/** `have`: the digests of the tablet's sections, joined with ".". */
export const haveSchema = z
  .string()
  .max(SNAPSHOT_SECTIONS.length * 17)
  .transform((v) => v.split("."))
  .refine((d) => d.length === SNAPSHOT_SECTIONS.length && d.every((x) => DIGEST.test(x)), "have: one digest per section");

function sectionOf(s: JobSnapshot, k: SnapshotSection): unknown {
  return HEAD.has(k) ? s[k as "workOrder"] : (s.state as Record<string, unknown>)[k];
}

async function sha(text: string): Promise<string> {
  const bytes = new Uint8Array(await crypto.subtle.digest("SHA-256", new TextEncoder().encode(text)));
  return Array.from(bytes.subarray(0, 8), (b) => b.toString(16).padStart(2, "0")).join("");
}

/** The digest of each section (SNAPSHOT_SECTIONS order); a list an older copy lacks digests as absent. */
export function sectionDigests(s: JobSnapshot): Promise<string[]> {
  return Promise.all(SNAPSHOT_SECTIONS.map((k) => sha(stringify(sectionOf(s, k) ?? null))));
}

/** The copy's digest, from its sections' digests. */
export const snapshotDigest = (sections: readonly string[]) => sha(sections.join("."));

const rowsSchema = z.array(z.object({ at: z.number().int().min(0), row: z.record(z.string(), z.unknown()) }));

/** The answer when nothing in the job changed since the tablet's copy: it is current to `cursor`. */
export const snapshotUnchangedSchema = z.object({ cursor: cursorSchema, unchanged: z.literal(true) });

/** The answer when something changed and the tablet sent `since` and `have`. */
export const snapshotDeltaSchema = z.object({
  delta: z.object({
    since: cursorSchema,
    cursor: cursorSchema,
    digest: z.string().regex(DIGEST),
    /** Sections sent whole. */
    replace: z.partialRecord(z.enum(SNAPSHOT_SECTIONS), z.unknown()),
    /** Entries of the growing lists recorded after `since`, with their place in the record's list. */
    rows: z.partialRecord(z.enum(Object.keys(ROW_LISTS) as [RowList, ...RowList[]]), rowsSchema),
  }),
});
export type SnapshotDelta = z.output<typeof snapshotDeltaSchema>["delta"];

/** What the server knows of the entries recorded after `since` (ids of operations of the job with a later seq). */
export interface ChangedSince {
  since: bigint;
  operationIds: ReadonlySet<string>;
}

type Reading = State["readings"][number];

/**
 * The readings that were current at `since` on the spots where a new reading came (the record's
 * rule, as the current_measurements view has it: among the readings no other supersedes, the latest
 * stamp, compared byte-wise, then the highest id): their `current` may have changed.
 */
function formerlyCurrent(readings: readonly Reading[], isNew: (id: string) => boolean): Set<string> {
  const spot = (r: Reading) => `${r.specId}|${r.readingIndex}`;
  const touched = new Set(readings.filter((r) => isNew(r.id)).map(spot));
  const older = readings.filter((r) => touched.has(spot(r)) && !isNew(r.id));
  const superseded = new Set(older.map((r) => r.supersedesId).filter((x): x is string => x !== null));
  const best = new Map<string, Reading>();
  for (const r of older) {
    if (superseded.has(r.id)) continue;
    const b = best.get(spot(r));
    if (!b || r.stamp > b.stamp || (r.stamp === b.stamp && r.id > b.id)) best.set(spot(r), r);
  }
  return new Set([...best.values()].map((r) => r.id));
}

function changed(list: RowList, row: Record<string, unknown>, c: ChangedSince, wasCurrent: ReadonlySet<string>): boolean {
  switch (list) {
    case "reviewDecisions":
      return BigInt(String(row.seq)) > c.since;
    case "readings":
      return c.operationIds.has(String(row.id)) || wasCurrent.has(String(row.id));
    default:
      return c.operationIds.has(String(row.id));
  }
}

/** The delta from a copy with the sections `have` to the record `fresh` (with its own digests). */
export async function buildSnapshotDelta(fresh: JobSnapshot, freshDigests: readonly string[], have: readonly string[], c: ChangedSince) {
  const replace: Partial<Record<SnapshotSection, unknown>> = {};
  const rows: Partial<Record<RowList, { at: number; row: Record<string, unknown> }[]>> = {};
  const wasCurrent = formerlyCurrent(fresh.state.readings, (id) => c.operationIds.has(id));
  SNAPSHOT_SECTIONS.forEach((k, i) => {
    if (freshDigests[i] === have[i]) return;
    if (!isRowList(k)) {
      replace[k] = sectionOf(fresh, k);
      return;
    }
    const list = (fresh.state[k] ?? []) as unknown as Record<string, unknown>[];
    rows[k] = list.flatMap((row, at) => (changed(k, row, c, wasCurrent) ? [{ at, row }] : []));
  });
  return { since: String(c.since), cursor: fresh.cursor, digest: await snapshotDigest(freshDigests), replace, rows };
}

/** The tablet's copy with a delta applied (not yet checked: parse it and compare its digest with `delta.digest`). */
export function applySnapshotDelta(held: JobSnapshot, delta: SnapshotDelta): unknown {
  const copy = structuredClone(held);
  const next = copy as unknown as Record<string, unknown>;
  const state = copy.state as unknown as Record<string, unknown>;
  for (const [k, v] of Object.entries(delta.replace) as [SnapshotSection, unknown][]) {
    if (HEAD.has(k)) next[k] = v;
    else state[k] = v;
  }
  for (const [k, entries] of Object.entries(delta.rows) as [RowList, z.output<typeof rowsSchema>][]) {
    const key = ROW_LISTS[k];
    const incoming = new Set(entries.map((e) => String(e.row[key])));
    const list = ((state[k] ?? []) as Record<string, unknown>[]).filter((row) => !incoming.has(String(row[key])));
    for (const e of [...entries].sort((a, b) => a.at - b.at)) list.splice(e.at, 0, e.row);
    state[k] = list;
  }
  next.cursor = delta.cursor;
  return next;
}
