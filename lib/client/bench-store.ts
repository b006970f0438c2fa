/**
 * Every write to the tablet's store (`./bench-db.ts`) goes through this module: recording work
 * (outbox appends, a photo with its operation), job copies, the job list, what a sync answer said
 * and the sync's own notes. The rules it keeps:
 *  - an operation is appended in one transaction with the clock, so a crash never reuses a stamp;
 *    a photo and its operation are written in one transaction too;
 *  - a job copy is never replaced by an older one (lower server cursor);
 *  - an operation the server stored leaves the outbox only once a copy of its job at least as new
 *    as the answer that stored it is on the tablet; until then the screen draws it on top;
 *  - nothing leaves the outbox silently: a refused entry stays, with its reason, until the
 *    mechanic sends it again or discards it with a reason and the server has written that down.
 */
import Dexie from "dexie";
import { createClock, receive, tick, type HlcState } from "@/lib/sync/hlc";
import { compareCursors, isAtLeast, laterCursor } from "@/lib/sync/cursor";
import { operationSchema, type Operation, type OperationKind, type PHOTO_CONTENT_TYPES } from "@/lib/sync/operations";
import type { BenchJobSummary, JobSnapshot } from "@/lib/sync/snapshot";
import {
  EMPTY_SYNC_META,
  META,
  readMeta,
  type BenchDb,
  type OutboxEntry,
  type StoredPhoto,
  type SyncMeta,
  type WantedCopy,
} from "./bench-db";

type PayloadOf<K extends OperationKind> = Extract<Operation, { kind: K }>["payload"];

/** Who records: the signed-in user on this tablet. */
export interface Author {
  userId: string;
  deviceId: string;
}

/*
 * Inside a dexie transaction only dexie's own promises are awaited, directly or through helpers
 * that return dexie promise chains (`.then`): an `async` helper awaited inside a transaction can
 * lose it when another transaction holds the same tables (the transaction commits early).
 */

/** The scope of one transaction on meta and outbox (and photos, with `photo`): stamps, validates and appends. */
function appendOperation<K extends OperationKind>(
  db: BenchDb,
  author: Author,
  workOrderId: string,
  kind: K,
  payload: PayloadOf<K>,
  now: number,
  photo?: StoredPhoto,
): Promise<Operation> {
  return readMeta(db, META.clock, createClock(author.deviceId)).then((clock: HlcState) => {
    const base = clock.deviceId === author.deviceId ? clock : createClock(author.deviceId);
    const { state, stamp } = tick(base, now);
    // Validate with the same schema the server uses: a bad entry is caught here, not at sync time.
    const op = operationSchema.parse({
      id: crypto.randomUUID(),
      kind,
      workOrderId,
      authorId: author.userId,
      deviceId: author.deviceId,
      deviceTime: new Date(now).toISOString(),
      stamp,
      payload,
    });
    return db.meta
      .put({ key: META.clock, value: state })
      .then(() => (photo ? db.photos.add(photo) : undefined))
      .then(() => db.outbox.add({ id: op.id, workOrderId, stamp, op, state: "waiting", createdAt: now }))
      .then(() => op);
  });
}

/** Records one piece of work: a new operation in the outbox, stamped in one transaction with the clock. */
export async function recordOperation<K extends OperationKind>(
  db: BenchDb,
  author: Author,
  workOrderId: string,
  kind: K,
  payload: PayloadOf<K>,
  now = Date.now(),
): Promise<Operation> {
  return db.transaction("rw", db.meta, db.outbox, () => appendOperation(db, author, workOrderId, kind, payload, now));
}

export interface NewPhoto {
  stepId: string;
  blob: Blob;
  contentType: (typeof PHOTO_CONTENT_TYPES)[number];
  caption?: string;
}

/** Keeps a photo's bytes on the tablet and records its `photo.queued` operation, in one transaction. */
export async function recordPhoto(db: BenchDb, author: Author, workOrderId: string, photo: NewPhoto, now = Date.now()): Promise<Operation> {
  const id = crypto.randomUUID();
  const row: StoredPhoto = {
    id,
    workOrderId,
    stepId: photo.stepId,
    blob: photo.blob,
    contentType: photo.contentType,
    byteSize: photo.blob.size,
    caption: photo.caption ?? "",
    uploaded: 0,
    createdAt: now,
  };
  const payload = {
    attachmentId: id,
    stepId: photo.stepId,
    contentType: photo.contentType,
    byteSize: photo.blob.size,
    ...(photo.caption ? { caption: photo.caption } : {}),
  };
  return db.transaction("rw", [db.meta, db.outbox, db.photos], () =>
    appendOperation(db, author, workOrderId, "photo.queued", payload, now, row),
  );
}

/**
 * Inside a transaction on jobs, outbox and wanted: lets go of what the stored copy of `jobId` now
 * covers — sent operations stored at or before its cursor, and the wish for a newer copy.
 */
function settleJob(db: BenchDb, jobId: string): Promise<unknown> {
  return db.jobs.get(jobId).then((held) => {
    const copy = held?.snapshot.cursor;
    if (copy == null) return undefined;
    return db.outbox
      .where("workOrderId")
      .equals(jobId)
      .filter((e) => e.state === "sent" && e.sentCursor != null && isAtLeast(copy, e.sentCursor))
      .delete()
      .then(() => db.wanted.get(jobId))
      .then((wanted) => (wanted && isAtLeast(copy, wanted.cursor) ? db.wanted.delete(jobId) : undefined));
  });
}

/**
 * Stores a copy of a job unless the tablet already holds a newer one (higher cursor); a copy at
 * the same cursor replaces the held one. Returns whether it was stored.
 */
export async function storeJobCopy(db: BenchDb, snapshot: JobSnapshot, now = Date.now()): Promise<boolean> {
  const id = snapshot.workOrder.id;
  return db.transaction("rw", [db.jobs, db.outbox, db.wanted], async () => {
    const held = await db.jobs.get(id);
    if (held && compareCursors(held.snapshot.cursor, snapshot.cursor) > 0) return false;
    await db.jobs.put({ id, snapshot, fetchedAt: now });
    await settleJob(db, id);
    return true;
  });
}

/** The job is gone for this user (404/403): its copy goes, and what was sent for it needs no newer copy. */
export async function forgetJobCopy(db: BenchDb, jobId: string): Promise<void> {
  await db.transaction("rw", [db.jobs, db.outbox, db.wanted], async () => {
    await db.jobs.delete(jobId);
    await db.outbox
      .where("workOrderId")
      .equals(jobId)
      .filter((e) => e.state === "sent")
      .delete();
    await db.wanted.delete(jobId);
  });
}

export async function replaceJobList(db: BenchDb, jobs: readonly BenchJobSummary[], now = Date.now()): Promise<void> {
  await db.transaction("rw", db.jobList, async () => {
    await db.jobList.clear();
    await db.jobList.bulkPut(jobs.map((j) => ({ ...j, listedAt: now })));
  });
}

export interface SyncAnswer {
  deviceId: string;
  /** Ids the server stored (accepted now or earlier). */
  stored: readonly string[];
  refused: ReadonlyArray<{ id: string; reason: string }>;
  /** Held on the server until the record they act on arrives. */
  held?: ReadonlyArray<{ id: string; reason: string }>;
  /** Jobs that changed: those the sent operations name and those in the changes from elsewhere. */
  touchedJobs: Iterable<string>;
  /** The answer's cursor (the last page's, when the changes came in several). */
  cursor: string;
  /** Stamps of the changes from elsewhere, for the clock. */
  remoteStamps: readonly string[];
}

/**
 * Keeps what a sync answer said, in one transaction, before any job copy is fetched: stored
 * operations become "sent" (they stay on screen), refused ones keep the reason, every touched job
 * the tablet holds (or has sent work for) wants a copy at least as new as the answer, the clock
 * takes in the stamps seen, and the cursor moves on.
 */
export async function keepSyncAnswer(db: BenchDb, answer: SyncAnswer, now = Date.now()): Promise<void> {
  await db.transaction("rw", [db.jobs, db.outbox, db.wanted, db.meta], async () => {
    const touched = new Set(answer.touchedJobs);
    const sent: OutboxEntry[] = [];
    for (const entry of await db.outbox.bulkGet([...answer.stored])) if (entry) sent.push(entry);
    await db.outbox.bulkPut(
      sent.map((e) => ({ ...e, state: "sent" as const, sentCursor: laterCursor(e.sentCursor, answer.cursor), reason: undefined })),
    );
    for (const e of sent) touched.add(e.workOrderId);
    // An entry the mechanic chose to discard while this answer was on its way stays being discarded
    // (the server's reason is kept with it): the answer must not undo the mechanic's choice.
    const discarding = new Set(
      (await db.outbox.bulkGet([...answer.refused.map((r) => r.id), ...(answer.held ?? []).map((h) => h.id)]))
        .filter((e) => e?.state === "discarding")
        .map((e) => e!.id),
    );
    for (const r of answer.refused)
      await db.outbox.update(
        r.id,
        discarding.has(r.id) ? { reason: r.reason, refusedAt: now } : { state: "refused", reason: r.reason, refusedAt: now },
      );
    for (const h of answer.held ?? []) if (!discarding.has(h.id)) await db.outbox.update(h.id, { state: "held", reason: h.reason });

    const sentFor = new Set(sent.map((e) => e.workOrderId));
    const held = new Set(
      await db.jobs
        .where("id")
        .anyOf([...touched])
        .primaryKeys(),
    );
    for (const jobId of touched) {
      if (!held.has(jobId) && !sentFor.has(jobId)) continue; // a job this tablet never opened
      const wanted = await db.wanted.get(jobId);
      await db.wanted.put({ ...wanted, id: jobId, cursor: laterCursor(wanted?.cursor, answer.cursor), since: wanted?.since ?? now });
      await settleJob(db, jobId);
    }

    let clock = await readMeta<HlcState>(db, META.clock, createClock(answer.deviceId));
    for (const s of answer.remoteStamps) {
      try {
        clock = receive(clock, s, now, { maxAheadMs: 5 * 60_000 }).state;
      } catch {
        // a stamp from a tablet with a wrong clock: do not drag ours forward
      }
    }
    await db.meta.put({ key: META.clock, value: clock });
    const meta = await readMeta(db, META.sync, EMPTY_SYNC_META);
    await db.meta.put({ key: META.sync, value: { ...meta, cursor: answer.cursor } satisfies SyncMeta });
  });
}

/** Notes on the sync itself, shown in the sync bar. */
export async function noteSync(db: BenchDb, patch: Partial<Omit<SyncMeta, "cursor">>): Promise<void> {
  await db.transaction("rw", db.meta, async () => {
    const meta = await readMeta(db, META.sync, EMPTY_SYNC_META);
    await db.meta.put({ key: META.sync, value: { ...meta, ...patch } satisfies SyncMeta });
  });
}

export async function markPhotoUploaded(db: BenchDb, id: string): Promise<void> {
  await db.photos.update(id, { uploaded: 1, refusedAt: undefined, refusedReason: undefined });
}

/** The server refused a photo's bytes: what it said stays on the photo (shown at its step), and when. */
export async function markPhotoRefused(db: BenchDb, id: string, reason: string, now = Date.now()): Promise<void> {
  await db.photos.update(id, { refusedAt: now, refusedReason: reason.slice(0, 400) });
}

/** The photos this tablet holds for one step of one job (step ids come from templates, so several jobs share them). */
export function photosOfStep(db: BenchDb, jobId: string, stepId: string) {
  return db.photos
    .where("stepId")
    .equals(stepId)
    .filter((p) => p.workOrderId === jobId)
    .toArray();
}

/** Outbox states the server has not taken (a held entry it has): handed over at a session's end, named before a sign-out. */
export const UNTAKEN_STATES = ["waiting", "refused", "discarding"] as const;

/** Entries the server does not have yet (`UNTAKEN_STATES`) and photos whose bytes it does not have. */
export async function unsentCount(db: BenchDb): Promise<number> {
  const [entries, photos] = await Promise.all([
    db.outbox.where("state").anyOf(UNTAKEN_STATES).count(),
    db.photos.where("uploaded").equals(0).count(),
  ]);
  return entries + photos;
}

/** How long a photo's bytes stay on the tablet after they reached object storage, while its job is still at the bench. */
export const SENT_PHOTO_KEEP_MS = 7 * 24 * 3600 * 1000;

/**
 * Frees the tablet of photo bytes object storage already holds: those of jobs no longer open for
 * bench work on this tablet (handed over, closed, given to someone else), and those taken more than
 * `SENT_PHOTO_KEEP_MS` ago. The step then shows the stored copy from the server. A photo not yet
 * sent is never touched. Returns how many were cleared.
 */
export async function trimSentPhotos(db: BenchDb, openJobIds: ReadonlySet<string>, now = Date.now()): Promise<number> {
  return db.transaction("rw", db.photos, () =>
    db.photos
      .where("uploaded")
      .equals(1)
      .filter((p) => !openJobIds.has(p.workOrderId) || now - p.createdAt > SENT_PHOTO_KEEP_MS)
      .delete(),
  );
}

// ——— reads that go with the rules above ———

/** Operations to send: those waiting, and those the server holds (to learn when it has applied them), in stamp order. */
export async function waitingOperations(db: BenchDb): Promise<Operation[]> {
  const rows = await db.outbox.where("state").anyOf("waiting", "held").sortBy("stamp");
  return rows.map((r) => r.op);
}

/** This job's work the screen draws on top of its copy: waiting, held and sent-but-not-yet-in-the-copy, in stamp order. */
export async function workOnTop(db: BenchDb, jobId: string): Promise<Operation[]> {
  const rows = await db.outbox.where("workOrderId").equals(jobId).sortBy("stamp");
  return rows.filter((r) => r.state === "waiting" || r.state === "sent" || r.state === "held").map((r) => r.op);
}

// ——— refused and held entries: kept in view until sent again or discarded with a reason ———

/** Entries the mechanic has to decide on (refused), the server holds, or that are being discarded; oldest first. */
export async function entriesNeedingAttention(db: BenchDb): Promise<OutboxEntry[]> {
  return db.outbox.where("state").anyOf("refused", "held", "discarding").sortBy("stamp");
}

/** Marks an entry the server could not store (its batch kept failing on the server, alone too) as refused, with why. */
export async function markUnstorable(db: BenchDb, id: string, reason: string, now = Date.now()): Promise<void> {
  await db.outbox
    .where("id")
    .equals(id)
    .filter((e) => e.state === "waiting" || e.state === "held")
    .modify({ state: "refused", reason, refusedAt: now });
}

/** Sends a refused entry again with the next sync (after its cause was fixed). */
export async function resendEntry(db: BenchDb, id: string): Promise<void> {
  await db.outbox
    .where("id")
    .equals(id)
    .filter((e) => e.state === "refused")
    .modify((e) => {
      e.state = "waiting";
      delete e.reason;
      delete e.refusedAt;
    });
}

/** The mechanic discards a refused or held entry, saying why; it goes once the server has written that down. */
export async function discardEntry(db: BenchDb, id: string, reason: string): Promise<void> {
  await db.outbox
    .where("id")
    .equals(id)
    .filter((e) => e.state === "refused" || e.state === "held")
    .modify({ state: "discarding", discardReason: reason });
}

/** Takes back a discard not yet sent: the entry is refused (or held) again. */
export async function keepEntry(db: BenchDb, id: string): Promise<void> {
  await undoDiscards(db, [id], "");
}

/** Discards the server did not take: the entries are refused (or held) again, with the server's answer added to the reason. */
export async function undoDiscards(db: BenchDb, ids: readonly string[], why: string): Promise<void> {
  await db.outbox
    .where("id")
    .anyOf([...ids])
    .filter((e) => e.state === "discarding")
    .modify((e) => {
      e.state = e.refusedAt === undefined ? "held" : "refused";
      e.reason = `${e.reason ?? ""} ${why}`.trim();
      delete e.discardReason;
    });
}

/** Entries whose discard is to be sent to the server. */
export async function discardsToSend(db: BenchDb): Promise<OutboxEntry[]> {
  return db.outbox.where("state").equals("discarding").toArray();
}

/**
 * What the server said about discards: a discarded entry leaves the outbox (with the bytes of its
 * photo, which will never be sent); one the server holds as recorded work goes back to waiting, so
 * the next sync learns it is stored.
 */
export async function settleDiscards(db: BenchDb, results: ReadonlyArray<{ id: string; outcome: "discarded" | "stored" }>): Promise<void> {
  await db.transaction("rw", [db.outbox, db.photos], async () => {
    for (const r of results) {
      const entry = await db.outbox.get(r.id);
      if (!entry || entry.state !== "discarding") continue;
      if (r.outcome === "stored") {
        await db.outbox.update(r.id, { state: "waiting", reason: undefined, discardReason: undefined });
        continue;
      }
      const op = entry.op as { kind?: unknown; payload?: { attachmentId?: unknown } };
      if (op.kind === "photo.queued" && typeof op.payload?.attachmentId === "string") await db.photos.delete(op.payload.attachmentId);
      await db.outbox.delete(r.id);
    }
  });
}

/** Jobs whose copy on the tablet is older than a sync answer said (or missing while work was sent for them). */
export async function olderCopies(db: BenchDb): Promise<WantedCopy[]> {
  const wanted = await db.wanted.toArray();
  const copies = await db.jobs.bulkGet(wanted.map((w) => w.id));
  return wanted.filter((w, i) => !isAtLeast(copies[i]?.snapshot.cursor, w.cursor));
}

/** At the end of a sync run: the copies still older than the answer were missed (the bench says so). */
export async function markMissedCopies(db: BenchDb, now = Date.now()): Promise<void> {
  // No transaction needed: a copy stored meanwhile has deleted its row, and updating a missing row does nothing.
  for (const w of await olderCopies(db)) if (w.missedAt === undefined) await db.wanted.update(w.id, { missedAt: now });
}

/**
 * The cursor a sync answer said this job reached, when a sync run ended without a copy that new
 * (the reload failed); else null. While a run is still fetching the copy this stays null, so a
 * normal sync never flashes a warning.
 */
export async function missedCopyCursor(db: BenchDb, jobId: string): Promise<string | null> {
  const [wanted, copy] = await Promise.all([db.wanted.get(jobId), db.jobs.get(jobId)]);
  if (!wanted || wanted.missedAt === undefined || isAtLeast(copy?.snapshot.cursor, wanted.cursor)) return null;
  return wanted.cursor;
}

/**
 * Deletes this user's whole store from the tablet (the office ended the session: see
 * `./session-end.ts`, which first hands the unsent work over). The next sign-in starts empty.
 */
export async function dropBenchStore(db: BenchDb): Promise<void> {
  db.close();
  await Dexie.delete(db.name);
}
