/**
 * Moving work between the tablet and the server. One run (never two at once: see
 * `./single-flight.ts` and the bench's sync hook):
 *  1. push the waiting outbox in batches (POST /api/sync), collecting what the server stored,
 *     what it refused (kept on the tablet with the reason, shown to the mechanic) and the changes
 *     made elsewhere since our cursor;
 *  2. keep the answer at once (`keepSyncAnswer`): stored operations become "sent" — still in the
 *     outbox and still drawn on screen — and every job they or the changes touch wants a copy at
 *     least as new as the answer's cursor;
 *  3. fetch those copies (and the copies of jobs newly assigned to this user); each copy is stored
 *     only if it is not older than the one held, and only then do the sent operations it covers
 *     leave the outbox. A copy that cannot be fetched now leaves the sent work on screen and the
 *     job marked as older than the last sync, for the next run;
 *  4. the job list, then the bytes of photos whose entry the server holds.
 * A run cut off anywhere is safe to repeat: the server ignores operations it already has.
 */
import { splitIntoBatches } from "@/lib/sync/batching";
import { tabletSyncResponseSchema } from "@/lib/sync/changes";
import { benchJobListSchema, jobSnapshotSchema, type JobSnapshot } from "@/lib/sync/snapshot";
import { readSyncMeta, type BenchDb } from "./bench-db";
import {
  forgetJobCopy,
  keepSyncAnswer,
  markMissedCopies,
  markPhotoUploaded,
  noteSync,
  olderCopies,
  replaceJobList,
  storeJobCopy,
  waitingOperations,
} from "./bench-store";

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

async function fetchJobSnapshot(fetchFn: typeof fetch, id: string): Promise<JobSnapshot> {
  return getJson(fetchFn, `/api/bench/jobs/${id}`, (v) => jobSnapshotSchema.parse(v));
}

/** Fetches a job's copy and stores it unless a newer one is held. Returns the copy fetched. */
export async function refreshJobCopy(db: BenchDb, id: string, fetchFn: typeof fetch = fetch): Promise<JobSnapshot> {
  const snapshot = await fetchJobSnapshot(fetchFn, id);
  await storeJobCopy(db, snapshot);
  return snapshot;
}

function describeError(e: unknown): string {
  return e instanceof TypeError ? "No network: work is kept on this tablet." : e instanceof Error ? e.message : String(e);
}

export async function syncOnce(db: BenchDb, deviceId: string, fetchFn: typeof fetch = fetch): Promise<SyncReport> {
  await noteSync(db, { lastAttemptAt: Date.now() });
  try {
    const report = await run(db, deviceId, fetchFn);
    await noteSync(db, { lastSyncedAt: Date.now(), lastError: null });
    return report;
  } catch (e) {
    await noteSync(db, { lastError: describeError(e) });
    throw e;
  }
}

async function run(db: BenchDb, deviceId: string, fetchFn: typeof fetch): Promise<SyncReport> {
  const waiting = await waitingOperations(db);
  const batches = waiting.length ? splitIntoBatches(waiting) : [[]];
  let cursor = (await readSyncMeta(db)).cursor;
  const stored = new Set<string>();
  const refused: Array<{ id: string; reason: string }> = [];
  const touchedJobs = new Set<string>();
  let changes = 0;
  const remoteStamps: string[] = [];

  for (const batch of batches) {
    let more = true;
    let ops = batch;
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
  let jobsRefreshed = 0;
  // The last answer's cursor is the shop's cursor after our operations were stored (more = false).
  await keepSyncAnswer(db, { deviceId, stored: [...stored], refused, touchedJobs, cursor: cursor!, remoteStamps });

  try {
    const list = await getJson(fetchFn, "/api/bench/jobs", (v) => benchJobListSchema.parse(v));
    const have = new Set(await db.jobs.toCollection().primaryKeys());
    const toLoad = new Set((await olderCopies(db)).map((w) => w.id));
    for (const j of list.jobs) if (j.assignedToMe && j.mayWork && !have.has(j.id)) toLoad.add(j.id);
    let failed: unknown = null;
    for (const id of toLoad) {
      try {
        await refreshJobCopy(db, id, fetchFn);
        jobsRefreshed++;
      } catch (e) {
        if (e instanceof SyncHttpError && (e.status === 404 || e.status === 403)) {
          await forgetJobCopy(db, id);
          continue;
        }
        failed ??= e;
        if (e instanceof TypeError) break; // the network went: the next run tries again
      }
    }
    if (failed) throw failed;
    await replaceJobList(db, list.jobs);
  } finally {
    await markMissedCopies(db);
  }
  const photosSent = await uploadPhotos(db, fetchFn);
  return { sent: waiting.length, stored: stored.size, refused: refused.length, changes, jobsRefreshed, photosSent };
}

/**
 * Sends the bytes of photos whose entry the server already holds (their photo.queued operation is
 * no longer waiting). A photo whose entry is still waiting or was refused, or one the server cannot
 * take now, stays on the tablet; the sync itself does not fail for it.
 */
async function uploadPhotos(db: BenchDb, fetchFn: typeof fetch): Promise<number> {
  const pending = await db.photos.where("uploaded").equals(0).toArray();
  const notOnServer = new Set(
    (await db.outbox.toArray()).flatMap((o) => (o.op.kind === "photo.queued" && o.state !== "sent" ? [o.op.payload.attachmentId] : [])),
  );
  let sent = 0;
  for (const photo of pending) {
    if (notOnServer.has(photo.id)) continue;
    const res = await fetchFn(`/api/bench/photos/${photo.id}`, {
      method: "POST",
      headers: { "content-type": photo.contentType },
      body: photo.blob,
    });
    if (res.ok) {
      await markPhotoUploaded(db, photo.id);
      sent++;
    }
  }
  return sent;
}
