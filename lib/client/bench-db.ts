/**
 * The tablet's own store (IndexedDB through dexie). One database per signed-in user on this
 * browser, so two people sharing a tablet never mix their work. Everything the bench screens show
 * is read from here; the network only moves the outbox up and snapshots down.
 */
import Dexie, { type Table } from "dexie";
import type { HlcState } from "@/lib/sync/hlc";
import type { Operation } from "@/lib/sync/operations";
import type { BenchJobSummary, JobSnapshot } from "@/lib/sync/snapshot";

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
  /** waiting: not yet stored by the server; refused: the server said no (reason kept and shown). */
  state: "waiting" | "refused";
  reason?: string;
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

  constructor(name: string) {
    super(name);
    this.version(1).stores({
      jobs: "id",
      jobList: "id",
      outbox: "id, stamp, workOrderId, state",
      photos: "id, workOrderId, stepId, uploaded",
      meta: "key",
    });
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

export async function getMeta<T>(db: BenchDb, key: string, fallback: T): Promise<T> {
  const row = await db.meta.get(key);
  return row ? (row.value as T) : fallback;
}

export async function setMeta(db: BenchDb, key: string, value: unknown): Promise<void> {
  await db.meta.put({ key, value });
}

export const META = { clock: "clock", sync: "sync" } as const;
export type { HlcState };
