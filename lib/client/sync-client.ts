/**
 * Moving work between the tablet and the server. One run (never two at once: see
 * `./single-flight.ts` and the bench's sync hook):
 *  0. send the discards the mechanic made (POST /api/sync/discards): an entry leaves the outbox
 *     only once the server has written down what it was and why it goes;
 *  1. push the waiting outbox (and the entries the server holds) in batches (POST /api/sync),
 *     collecting what the server stored, held, refused (kept on the tablet with the reason, shown
 *     to the mechanic) and the changes made elsewhere since our cursor. A batch the server fails
 *     on (5xx) while it still answers an empty batch is split in halves and each sent on its own,
 *     down to the one entry that fails, which is kept as refused with the server's error: one bad
 *     entry never holds back the others. A server that does not answer an empty batch either
 *     ends the run (the next one tries again);
 *  2. keep each answer at once (`keepSyncAnswer`): stored operations become "sent" — still in the
 *     outbox and still drawn on screen — and every job they or the changes touch wants a copy at
 *     least as new as the answer's cursor;
 *  3. fetch those copies (and the copies of jobs newly assigned to this user); each copy is stored
 *     only if it is not older than the one held, and only then do the sent operations it covers
 *     leave the outbox. A copy that cannot be fetched now leaves the sent work on screen and the
 *     job marked as older than the last sync, for the next run;
 *  4. the job list, then the bytes of photos whose entry the server holds; bytes already sent are
 *     cleared from the tablet once their job has left its bench, or after a week
 *     (`trimSentPhotos`).
 * A run cut off anywhere is safe to repeat: the server ignores operations it already has.
 */
import { splitIntoBatches } from "@/lib/sync/batching";
import { tabletSyncResponseSchema } from "@/lib/sync/changes";
import { discardResponseSchema } from "@/lib/sync/discards";
import type { Operation } from "@/lib/sync/operations";
import { benchJobListSchema, jobSnapshotSchema, type BenchJobSummary, type JobSnapshot } from "@/lib/sync/snapshot";
import { isOpenForBenchWork } from "@/lib/work-orders/status";
import { checkSession } from "./session-end";
import {
  applySnapshotDelta,
  sectionDigests,
  snapshotDeltaSchema,
  snapshotDigest,
  snapshotUnchangedSchema,
} from "@/lib/sync/snapshot-delta";
import { readSyncMeta, type BenchDb } from "./bench-db";
import {
  discardsToSend,
  forgetJobCopy,
  keepSyncAnswer,
  undoDiscards,
  markMissedCopies,
  markPhotoRefused,
  markPhotoUploaded,
  markUnstorable,
  noteSync,
  olderCopies,
  replaceJobList,
  settleDiscards,
  storeJobCopy,
  trimSentPhotos,
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

/** A request that has had no answer for this long is given up (the run ends; the next tries again), so one stalled connection never holds the sync's lock. */
export const REQUEST_TIMEOUT_MS = 60_000;
/** A photo's bytes may take longer on a slow workshop network. */
export const PHOTO_UPLOAD_TIMEOUT_MS = 120_000;
/** Photo bytes the server refused (not a passing trouble) are offered again after this long. */
export const PHOTO_RETRY_AFTER_REFUSAL_MS = 60 * 60 * 1000;

export interface SyncReport {
  sent: number;
  stored: number;
  refused: number;
  held: number;
  discarded: number;
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
  const res = await fetchFn(url, {
    headers: { accept: "application/json" },
    cache: "no-store",
    signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
  });
  if (!res.ok) throw new SyncHttpError(res.status, await errorText(res));
  return parse(await res.json());
}

async function fetchJobSnapshot(fetchFn: typeof fetch, id: string): Promise<JobSnapshot> {
  return getJson(fetchFn, `/api/bench/jobs/${id}`, (v) => jobSnapshotSchema.parse(v));
}

/**
 * A job's copy, fetching only what changed when the tablet holds one (lib/sync/snapshot-delta.ts):
 * the held copy as it is (nothing in the job changed), the held copy with the delta applied
 * once it has the record's digest, or else the whole copy.
 */
async function fetchJobCopy(db: BenchDb, fetchFn: typeof fetch, id: string): Promise<JobSnapshot> {
  const held = (await db.jobs.get(id))?.snapshot;
  if (!held || typeof crypto === "undefined" || !crypto.subtle) return fetchJobSnapshot(fetchFn, id);
  const have = await sectionDigests(held);
  const res = await fetchFn(`/api/bench/jobs/${id}`, {
    headers: { accept: "application/json", "x-bench-since": held.cursor, "x-bench-have": have.join(".") },
    cache: "no-store",
    signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
  });
  if (!res.ok) throw new SyncHttpError(res.status, await errorText(res));
  const body: unknown = await res.json();
  const unchanged = snapshotUnchangedSchema.safeParse(body);
  if (unchanged.success) return { ...held, cursor: unchanged.data.cursor };
  const delta = snapshotDeltaSchema.safeParse(body);
  if (!delta.success) return jobSnapshotSchema.parse(body);
  const next = jobSnapshotSchema.safeParse(applySnapshotDelta(held, delta.data.delta));
  if (next.success && (await snapshotDigest(await sectionDigests(next.data))) === delta.data.delta.digest) return next.data;
  return fetchJobSnapshot(fetchFn, id); // the delta did not give the record's copy: fetch it whole
}

/** Fetches a job's copy (only what changed, when one is held) and stores it unless a newer one is held. Returns the copy fetched. */
export async function refreshJobCopy(db: BenchDb, id: string, fetchFn: typeof fetch = fetch): Promise<JobSnapshot> {
  const snapshot = await fetchJobCopy(db, fetchFn, id);
  await storeJobCopy(db, snapshot);
  return snapshot;
}

function describeError(e: unknown): string {
  if (e instanceof TypeError) return "No network: work is kept on this tablet.";
  if (e instanceof Error && (e.name === "TimeoutError" || e.name === "AbortError")) {
    return "The server did not answer in time: work is kept on this tablet and sent with the next sync.";
  }
  return e instanceof Error ? e.message : String(e);
}

/** The browser is signed in as someone else than this bench's user (another tab signed in): nothing is sent. */
export class SignedInAsSomeoneElse extends Error {
  constructor() {
    super("This browser is now signed in as someone else (in another tab): nothing was sent. Reload the page.");
    this.name = "SignedInAsSomeoneElse";
  }
}

/**
 * One sync run. With `userId` (the bench's own user, whose store `db` is), the run first asks who
 * the browser is signed in as: a bench left open in one tab after another person signed in in
 * another would otherwise send this user's waiting work under the other's sign-in, where every
 * entry is refused (and could then be discarded by them).
 */
export async function syncOnce(
  db: BenchDb,
  deviceId: string,
  fetchFn: typeof fetch = fetch,
  opts: { userId?: string } = {},
): Promise<SyncReport> {
  await noteSync(db, { lastAttemptAt: Date.now() });
  try {
    if (opts.userId && (await checkSession(fetchFn, opts.userId)) === "someone-else") throw new SignedInAsSomeoneElse();
    const report = await run(db, deviceId, fetchFn);
    await noteSync(db, { lastSyncedAt: Date.now(), lastError: null });
    return report;
  } catch (e) {
    await noteSync(db, { lastError: describeError(e) });
    throw e;
  }
}

/** Sends the discards the mechanic made; what the server wrote down leaves the outbox. */
async function sendDiscards(db: BenchDb, deviceId: string, fetchFn: typeof fetch): Promise<number> {
  const entries = await discardsToSend(db);
  if (!entries.length) return 0;
  const res = await fetchFn("/api/sync/discards", {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({
      deviceId,
      discards: entries.map((e) => ({ id: e.id, operation: e.op, refusedReason: e.reason ?? "", reason: e.discardReason ?? "" })),
    }),
    signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
  });
  if (!res.ok) {
    const error = await errorText(res);
    if (res.status >= 500) throw new SyncHttpError(res.status, `Discarding: ${error}`);
    // Refused (a reason the server does not take): the entries come back to the list, saying why.
    await undoDiscards(
      db,
      entries.map((e) => e.id),
      `The discard was not accepted: ${error}`,
    );
    return 0;
  }
  const body = discardResponseSchema.parse(await res.json());
  await settleDiscards(db, body.results);
  return body.results.filter((r) => r.outcome === "discarded").length;
}

/** What the pushes of one run came to. */
interface PushTally {
  cursor: string | null;
  stored: number;
  refused: number;
  held: number;
  changes: number;
  touchedJobs: Set<string>;
}

/**
 * Sends one batch and pulls the rest of the changes (`more`), then keeps the answer (the last
 * page's cursor is the shop's cursor after our operations were stored). Returns the failed
 * response instead when the server answers the first request with an error.
 */
async function exchange(
  db: BenchDb,
  deviceId: string,
  fetchFn: typeof fetch,
  batch: Operation[],
  tally: PushTally,
): Promise<Response | null> {
  const stored = new Set<string>();
  const refused: Array<{ id: string; reason: string }> = [];
  const held: Array<{ id: string; reason: string }> = [];
  const touched = new Set<string>();
  const remoteStamps: string[] = [];
  let ops = batch;
  let more = true;
  let cursor = tally.cursor;
  while (more) {
    const res = await fetchFn("/api/sync", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ deviceId, cursor, operations: ops }),
      signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
    });
    if (!res.ok) {
      if (ops === batch) return res;
      throw new SyncHttpError(res.status, await errorText(res));
    }
    const body = tabletSyncResponseSchema.parse(await res.json());
    for (const id of [...body.accepted, ...body.duplicates]) stored.add(id);
    refused.push(...body.refused);
    held.push(...body.pending);
    for (const op of ops) touched.add(op.workOrderId);
    for (const c of body.changes) {
      tally.changes++;
      if (c.type === "unread") {
        // made by a newer server: reload its job (if it names one) and carry on
        if (c.workOrderId) touched.add(c.workOrderId);
        continue;
      }
      touched.add(c.workOrderId);
      remoteStamps.push(c.stamp);
    }
    cursor = body.cursor;
    more = body.more;
    ops = []; // further rounds only pull
  }
  await keepSyncAnswer(db, { deviceId, stored: [...stored], refused, held, touchedJobs: touched, cursor: cursor!, remoteStamps });
  tally.cursor = cursor;
  tally.stored += stored.size;
  tally.refused += refused.length;
  tally.held += held.length;
  for (const j of touched) tally.touchedJobs.add(j);
  return null;
}

/** Whether a failed answer is worth splitting the batch for: the server failed on it, or it was too big. */
const splittable = (status: number) => status >= 500 || status === 413;

/**
 * Sends a batch; when the server fails on it (and still answers an empty batch, so it is this
 * batch and not the server), sends each half on its own, down to the single entry that fails,
 * which is kept as refused with the server's error.
 */
async function push(db: BenchDb, deviceId: string, fetchFn: typeof fetch, batch: Operation[], tally: PushTally): Promise<void> {
  const failed = await exchange(db, deviceId, fetchFn, batch, tally);
  if (!failed) return;
  const error = await errorText(failed);
  if (!batch.length || !splittable(failed.status)) throw new SyncHttpError(failed.status, error);
  if (failed.status >= 500) {
    const probe = await exchange(db, deviceId, fetchFn, [], tally);
    if (probe) throw new SyncHttpError(probe.status, await errorText(probe)); // the server itself is failing: try later
  }
  if (batch.length === 1) {
    await markUnstorable(
      db,
      batch[0].id,
      `The server could not store this entry (${error}). It stays on this tablet: send it again later, or discard it with a reason.`,
    );
    tally.refused++;
    return;
  }
  const half = Math.ceil(batch.length / 2);
  await push(db, deviceId, fetchFn, batch.slice(0, half), tally);
  await push(db, deviceId, fetchFn, batch.slice(half), tally);
}

async function run(db: BenchDb, deviceId: string, fetchFn: typeof fetch): Promise<SyncReport> {
  const discarded = await sendDiscards(db, deviceId, fetchFn);
  const waiting = await waitingOperations(db);
  const batches = waiting.length ? splitIntoBatches(waiting) : [[]];
  const tally: PushTally = { cursor: (await readSyncMeta(db)).cursor, stored: 0, refused: 0, held: 0, changes: 0, touchedJobs: new Set() };
  for (const batch of batches) await push(db, deviceId, fetchFn, batch, tally);
  let jobsRefreshed = 0;
  let listed: ReadonlyArray<BenchJobSummary> | undefined;
  // A copy or list that cannot be had now ends the run with its error, but only after the photos:
  // one job's trouble never holds back the bytes of another's.
  let copiesFailed: unknown = null;

  try {
    const list = await getJson(fetchFn, "/api/bench/jobs", (v) => benchJobListSchema.parse(v));
    const have = new Set(await db.jobs.toCollection().primaryKeys());
    const toLoad = new Set((await olderCopies(db)).map((w) => w.id));
    for (const j of list.jobs) if (j.assignedToMe && j.mayWork && !have.has(j.id)) toLoad.add(j.id);
    for (const id of await copiesTheOfficeChanged(db, list.jobs)) toLoad.add(id);
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
    listed = list.jobs;
  } catch (e) {
    copiesFailed = e;
  } finally {
    await markMissedCopies(db);
  }
  const photosSent = await uploadPhotos(db, fetchFn);
  if (listed) await trimSentPhotos(db, new Set(listed.filter((j) => j.mayWork).map((j) => j.id)));
  if (copiesFailed) throw copiesFailed;
  return {
    sent: waiting.length,
    stored: tally.stored,
    refused: tally.refused,
    held: tally.held,
    discarded,
    changes: tally.changes,
    jobsRefreshed,
    photosSent,
  };
}

/**
 * Held copies the office has changed since: the job moved on (in review, ready, handed over — it
 * then leaves the list of jobs open for bench work — or back in build with more procedures pinned)
 * or was given to another mechanic. Such a change makes no bench entry, so the change feed does not
 * name the job; the job list does. A copy that says the same as the list (or already says the job
 * left the bench) is not fetched again.
 */
async function copiesTheOfficeChanged(db: BenchDb, listed: readonly BenchJobSummary[]): Promise<string[]> {
  const byId = new Map(listed.map((j) => [j.id, j]));
  const changed: string[] = [];
  await db.jobs.each((held) => {
    const w = held.snapshot.workOrder;
    const now = byId.get(held.id);
    if (!now) {
      if (isOpenForBenchWork(w.status)) changed.push(held.id);
      return;
    }
    if (now.status !== w.status || (now.assignedMechanic?.id ?? null) !== (w.assignedMechanic?.id ?? null) || now.mayWork !== w.mayWork) {
      changed.push(held.id);
    }
  });
  return changed;
}

/**
 * Sends the bytes of photos whose entry the server already holds (their photo.queued operation is
 * no longer waiting). A photo whose entry is still waiting or was refused, or one the server cannot
 * take now, stays on the tablet; the sync itself does not fail for it.
 */
async function uploadPhotos(db: BenchDb, fetchFn: typeof fetch, now = Date.now()): Promise<number> {
  const pending = await db.photos.where("uploaded").equals(0).toArray();
  const notOnServer = new Set(
    (await db.outbox.toArray()).flatMap((o) => (o.op?.kind === "photo.queued" && o.state !== "sent" ? [o.op.payload?.attachmentId] : [])),
  );
  let sent = 0;
  for (const photo of pending) {
    if (notOnServer.has(photo.id)) continue;
    // bytes the server refused are offered again only after a while, not with every sync
    if (photo.refusedAt !== undefined && now - photo.refusedAt < PHOTO_RETRY_AFTER_REFUSAL_MS) continue;
    let res: Response;
    try {
      res = await fetchFn(`/api/bench/photos/${photo.id}`, {
        method: "POST",
        headers: { "content-type": photo.contentType },
        body: photo.blob,
        signal: AbortSignal.timeout(PHOTO_UPLOAD_TIMEOUT_MS),
      });
    } catch {
      break; // no network, or it stalled: the next run tries again
    }
    if (res.ok) {
      await markPhotoUploaded(db, photo.id);
      sent++;
    } else if (res.status >= 400 && res.status < 500 && res.status !== 401 && res.status !== 408 && res.status !== 429) {
      await markPhotoRefused(db, photo.id, await errorText(res), now);
    }
  }
  return sent;
}
