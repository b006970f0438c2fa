/**
 * The tablet's own store (IndexedDB through dexie): its tables and what they hold. One database
 * per signed-in user on this browser, so two people sharing a tablet never mix their work.
 * Everything the bench screens show is read from here; every write goes through
 * `./bench-store.ts`.
 */
import Dexie, { type Table } from "dexie";
import type { Operation } from "@/lib/sync/operations";
import type { BenchJobSummary, JobSnapshot } from "@/lib/sync/snapshot";

/** A copy of one job as the server sent it; `snapshot.cursor` is the server cursor it is current to. */
export interface StoredJob {
  id: string;
  snapshot: JobSnapshot;
  fetchedAt: number;
}

export interface OutboxEntry {
  id: string;
  workOrderId: string;
  stamp: string;
  op: Operation;
  /**
   * waiting: not yet stored by the server. sent: the server stored it (answer cursor in
   * `sentCursor`) and it stays, drawn on top of the job copy, until a copy at least that new is
   * on the tablet. held: the server holds it until the record it acts on arrives (reason kept);
   * it is drawn on top and sent again with every sync until the server says it is stored.
   * refused: the server said no, or could not store it (reason kept and shown, with what it was;
   * the mechanic sends it again or discards it). discarding: the mechanic discards it
   * (`discardReason`); it leaves the outbox once the server has written that down.
   */
  state: "waiting" | "sent" | "held" | "refused" | "discarding";
  sentCursor?: string;
  reason?: string;
  /** When it was refused (ms), for the list. */
  refusedAt?: number;
  /** Why the person discards it. */
  discardReason?: string;
  createdAt: number;
}

export interface StoredPhoto {
  id: string;
  workOrderId: string;
  stepId: string;
  blob: Blob;
  contentType: string;
  byteSize: number;
  caption: string;
  /** 0 until the bytes reached object storage (numbers index in IndexedDB; booleans do not). */
  uploaded: 0 | 1;
  createdAt: number;
  /** When the server last refused the bytes (not a passing trouble), and what it said: shown at the step. */
  refusedAt?: number;
  refusedReason?: string;
}

/** A job whose copy must be at least as new as `cursor` (a sync answer touched it); gone once it is. */
export interface WantedCopy {
  id: string;
  cursor: string;
  since: number;
  /** Set when a sync run ended without the fresh copy (the reload failed): the bench then says so. */
  missedAt?: number;
}

export interface SyncMeta {
  cursor: string | null;
  lastSyncedAt: number | null;
  lastAttemptAt: number | null;
  lastError: string | null;
}

export class BenchDb extends Dexie {
  jobs!: Table<StoredJob, string>;
  jobList!: Table<BenchJobSummary & { listedAt: number }, string>;
  outbox!: Table<OutboxEntry, string>;
  photos!: Table<StoredPhoto, string>;
  meta!: Table<{ key: string; value: unknown }, string>;
  wanted!: Table<WantedCopy, string>;

  constructor(name: string) {
    super(name);
    this.version(1).stores({
      jobs: "id",
      jobList: "id",
      outbox: "id, stamp, workOrderId, state",
      photos: "id, workOrderId, stepId, uploaded",
      meta: "key",
    });
    this.version(2).stores({ wanted: "id" });
  }
}

const open = new Map<string, BenchDb>();
export function benchDb(userId: string): BenchDb {
  let db = open.get(userId);
  if (!db) {
    db = new BenchDb(`benchtag-bench-${userId}`);
    open.set(userId, db);
  }
  return db;
}

export const META = { clock: "clock", sync: "sync" } as const;

/** A meta value (a dexie promise chain, so it may be awaited inside a transaction). */
export function readMeta<T>(db: BenchDb, key: string, fallback: T): Promise<T> {
  return db.meta.get(key).then((row) => (row ? (row.value as T) : fallback));
}

export const EMPTY_SYNC_META: SyncMeta = { cursor: null, lastSyncedAt: null, lastAttemptAt: null, lastError: null };

export function readSyncMeta(db: BenchDb): Promise<SyncMeta> {
  return readMeta<SyncMeta>(db, META.sync, EMPTY_SYNC_META);
}
