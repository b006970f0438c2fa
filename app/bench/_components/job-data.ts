"use client";

import { useEffect, useState } from "react";
import { buildJobView, type JobView } from "@/lib/bench/job-view";
import type { Operation } from "@/lib/sync/operations";
import type { JobSnapshot } from "@/lib/sync/snapshot";
import type { StoredJob } from "@/lib/client/bench-db";
import { fetchJobSnapshot } from "@/lib/client/sync-client";
import { useBench } from "./bench-context";
import { useLive, useNow } from "./use-live";

export interface JobData {
  snapshot: JobSnapshot;
  view: JobView;
  pending: Operation[];
}

/** One job as the bench sees it: snapshot + this tablet's waiting work, live from IndexedDB. */
export function useJob(jobId: string): { data: JobData | null; loading: boolean; error: string | null } {
  const { db } = useBench();
  const now = useNow(1000);
  const stored = useLive<StoredJob | null | undefined>(() => db.jobs.get(jobId).then((j) => j ?? null), [db, jobId], undefined);
  const pending = useLive(
    () =>
      db.outbox
        .where("workOrderId")
        .equals(jobId)
        .sortBy("stamp")
        .then((rows) => rows.filter((r) => r.state === "waiting").map((r) => r.op)),
    [db, jobId],
    [] as Operation[],
  );
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    if (stored !== null || !navigator.onLine) return;
    fetchJobSnapshot(fetch, jobId)
      .then((s) => db.jobs.put({ id: jobId, snapshot: s, fetchedAt: Date.now() }))
      .catch((e) => setError(e instanceof Error ? e.message : String(e)));
  }, [stored, db, jobId]);
  if (stored === undefined) return { data: null, loading: true, error: null };
  if (!stored)
    return {
      data: null,
      loading: navigator.onLine && !error,
      error: error ?? (navigator.onLine ? null : "This job is not on this tablet yet, and there is no network."),
    };
  return { data: { snapshot: stored.snapshot, view: buildJobView(stored.snapshot, pending, now), pending }, loading: false, error: null };
}
