"use client";

import { useEffect, useState } from "react";
import { buildWorkOrderView, type WorkOrderView } from "@/lib/work-order-record";
import type { Operation } from "@/lib/sync/operations";
import type { JobSnapshot } from "@/lib/sync/snapshot";
import type { StoredJob } from "@/lib/client/bench-db";
import { missedCopyCursor, workOnTop } from "@/lib/client/bench-store";
import { refreshJobCopy } from "@/lib/client/sync-client";
import { useBench } from "./bench-context";
import { useLive, useNow } from "./use-live";

export interface JobData {
  snapshot: JobSnapshot;
  view: WorkOrderView;
  pending: Operation[];
  /** The last sync said the job changed after this copy was made and could not fetch it (the cursor it reached), or null. */
  olderThanSync: string | null;
}

/**
 * One job as the bench sees it, live from IndexedDB: the stored copy with this tablet's work that
 * the copy does not hold yet (waiting, or sent and not yet in a fresh copy) drawn on top. A copy
 * older than the last sync says so and is refreshed through the sync.
 */
export function useJob(jobId: string): { data: JobData | null; loading: boolean; error: string | null } {
  const { db, syncNow } = useBench();
  const now = useNow(1000);
  const stored = useLive<StoredJob | null | undefined>(() => db.jobs.get(jobId).then((j) => j ?? null), [db, jobId], undefined);
  const pending = useLive(() => workOnTop(db, jobId), [db, jobId], [] as Operation[]);
  const olderThanSync = useLive(() => missedCopyCursor(db, jobId), [db, jobId], null);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    if (stored !== null || !navigator.onLine) return;
    refreshJobCopy(db, jobId).catch((e) => setError(e instanceof Error ? e.message : String(e)));
  }, [stored, db, jobId]);
  useEffect(() => {
    if (olderThanSync !== null) syncNow();
  }, [olderThanSync, syncNow]);
  if (stored === undefined) return { data: null, loading: true, error: null };
  if (!stored)
    return {
      data: null,
      loading: navigator.onLine && !error,
      error: error ?? (navigator.onLine ? null : "This job is not on this tablet yet, and there is no network."),
    };
  return {
    data: { snapshot: stored.snapshot, view: buildWorkOrderView(stored.snapshot, pending, now), pending, olderThanSync },
    loading: false,
    error: null,
  };
}
