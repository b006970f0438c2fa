/**
 * Moving work between the tablet and the server. One run:
 *  1. push the waiting outbox in batches (POST /api/sync), collecting what the server stored,
 *     what it refused (kept on the tablet with the reason, shown to the mechanic) and the changes
 *     made elsewhere since our cursor;
 *  2. fetch fresh snapshots of the jobs touched (ours and others'), the job list, and the
 *     snapshots of jobs assigned to this user, so they open offline;
 *  3. in one IndexedDB transaction, store the snapshots and only then drop the stored operations
 *     from the outbox — until the snapshot holds them, the screen keeps showing them as waiting.
 * A run cut off anywhere is safe to repeat: the server ignores operations it already has.
 */
import { receive, type HlcState, createClock } from "@/lib/sync/hlc";
import { splitIntoBatches } from "@/lib/sync/batching";
import { tabletSyncResponseSchema } from "@/lib/sync/changes";
import { benchJobListSchema, jobSnapshotSchema, type JobSnapshot } from "@/lib/sync/snapshot";
import { getMeta, META, setMeta, type BenchDb, type SyncMeta } from "./bench-db";
import { waitingOperations } from "./outbox";

export class SyncHttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
    this.name = "SyncHttpError";
  }
}

export interface SyncReport {
  sent: number;
  stored: number;
  refused: number;
  changes: number;
  jobsRefreshed: number;
  photosSent: number;
}

const EMPTY_META: SyncMeta = { cursor: null, lastSyncedAt: null, lastAttemptAt: null, lastError: null };

export async function readSyncMeta(db: BenchDb): Promise<SyncMeta> {
  return getMeta<SyncMeta>(db, META.sync, EMPTY_META);
}

async function errorText(res: Response): Promise<string> {
  try {
    const body = (await res.json()) as { error?: string; issues?: Array<{ path?: unknown; message?: string }> };
    const issue = body.issues?.[0];
    return [body.error, issue ? `${JSON.stringify(issue.path)}: ${issue.message}` : ""].filter(Boolean).join(" — ") || `HTTP ${res.status}`;
  } catch {
    return `HTTP ${res.status}`;
  }
}

async function getJson<T>(fetchFn: typeof fetch, url: string, parse: (v: unknown) => T): Promise<T> {
  const res = await fetchFn(url, { headers: { accept: "application/json" }, cache: "no-store" });
  if (!res.ok) throw new SyncHttpError(res.status, await errorText(res));
  return parse(await res.json());
}

export async function fetchJobSnapshot(fetchFn: typeof fetch, id: string): Promise<JobSnapshot> {
  return getJson(fetchFn, `/api/bench/jobs/${id}`, (v) => jobSnapshotSchema.parse(v));
}

export async function syncOnce(db: BenchDb, deviceId: string, fetchFn: typeof fetch = fetch): Promise<SyncReport> {
  const meta = await readSyncMeta(db);
  await setMeta(db, META.sync, { ...meta, lastAttemptAt: Date.now() });
  try {
    const report = await run(db, deviceId, fetchFn, meta.cursor);
    await setMeta(db, META.sync, { ...(await readSyncMeta(db)), lastSyncedAt: Date.now(), lastError: null });
    return report;
  } catch (e) {
    const message = e instanceof TypeError ? "No network: work is kept on this tablet." : e instanceof Error ? e.message : String(e);
    await setMeta(db, META.sync, { ...(await readSyncMeta(db)), lastError: message });
    throw e;
  }
}

async function run(db: BenchDb, deviceId: string, fetchFn: typeof fetch, startCursor: string | null): Promise<SyncReport> {
  const waiting = await waitingOperations(db);
  const batches = waiting.length ? splitIntoBatches(waiting) : [[]];
  let cursor = startCursor;
  const stored = new Set<string>();
  const refused: Array<{ id: string; reason: string }> = [];
  const touchedJobs = new Set<string>();
  let changes = 0;
  const remoteStamps: string[] = [];

  for (let i = 0; i < batches.length; i++) {
    let more = true;
    let ops = batches[i];
    while (more) {
      const res = await fetchFn("/api/sync", {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ deviceId, cursor, operations: ops }),
      });
      if (!res.ok) throw new SyncHttpError(res.status, await errorText(res));
      const body = tabletSyncResponseSchema.parse(await res.json());
      for (const id of [...body.accepted, ...body.duplicates]) stored.add(id);
      refused.push(...body.refused);
      for (const op of ops) touchedJobs.add(op.workOrderId);
      for (const c of body.changes) {
        changes++;
        if (c.type === "unread") {
          // made by a newer server: reload its job (if it names one) and carry on
          if (c.workOrderId) touchedJobs.add(c.workOrderId);
          continue;
        }
        touchedJobs.add(c.type === "operation" ? c.operation.workOrderId : c.workOrderId);
        remoteStamps.push(c.type === "operation" ? c.operation.stamp : c.stamp);
      }
      cursor = body.cursor;
      more = body.more;
      ops = []; // further rounds only pull
    }
  }

  // Jobs to (re)load: touched ones, plus assigned jobs not on the tablet yet.
  const list = await getJson(fetchFn, "/api/bench/jobs", (v) => benchJobListSchema.parse(v));
  const have = new Set(await db.jobs.toCollection().primaryKeys());
  for (const j of list.jobs) if (j.assignedToMe && j.mayWork && !have.has(j.id)) touchedJobs.add(j.id);
  const snapshots: JobSnapshot[] = [];
  for (const id of touchedJobs) {
    try {
      snapshots.push(await fetchJobSnapshot(fetchFn, id));
    } catch (e) {
      if (!(e instanceof SyncHttpError && (e.status === 404 || e.status === 403))) throw e;
      await db.jobs.delete(id);
    }
  }

  const now = Date.now();
  await db.transaction("rw", [db.jobs, db.jobList, db.outbox, db.meta], async () => {
    await db.jobList.clear();
    await db.jobList.bulkPut(list.jobs.map((j) => ({ ...j, listedAt: now })));
    await db.jobs.bulkPut(snapshots.map((s) => ({ id: s.workOrder.id, snapshot: s, fetchedAt: now })));
    await db.outbox.bulkDelete([...stored]);
    for (const r of refused) await db.outbox.update(r.id, { state: "refused", reason: r.reason });
    let clock = await getMeta<HlcState>(db, META.clock, createClock(deviceId));
    for (const s of remoteStamps) {
      try {
        clock = receive(clock, s, now, { maxAheadMs: 5 * 60_000 }).state;
      } catch {
        // a stamp from a tablet with a wrong clock: do not drag ours forward
      }
    }
    await setMeta(db, META.clock, clock);
    const meta = await readSyncMeta(db);
    await setMeta(db, META.sync, { ...meta, cursor });
  });
  const photosSent = await uploadPhotos(db, fetchFn);
  return { sent: waiting.length, stored: stored.size, refused: refused.length, changes, jobsRefreshed: snapshots.length, photosSent };
}

/**
 * Sends the bytes of photos whose entry the server already holds (their photo.queued operation has
 * left the outbox). A photo whose entry is still waiting, or one the server cannot take now, stays
 * on the tablet for the next run; the sync itself does not fail for it.
 */
async function uploadPhotos(db: BenchDb, fetchFn: typeof fetch): Promise<number> {
  const pending = await db.photos.where("uploaded").equals(0).toArray();
  const waiting = new Set((await db.outbox.toArray()).flatMap((o) => (o.op.kind === "photo.queued" ? [o.op.payload.attachmentId] : [])));
  let sent = 0;
  for (const photo of pending) {
    if (waiting.has(photo.id)) continue;
    const res = await fetchFn(`/api/bench/photos/${photo.id}`, {
      method: "POST",
      headers: { "content-type": photo.contentType },
      body: photo.blob,
    });
    if (res.ok) {
      await db.photos.update(photo.id, { uploaded: 1 });
      sent++;
    }
  }
  return sent;
}
