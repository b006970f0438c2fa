"use client";

import { useBench } from "./bench-context";
import { BigButton } from "./big-button";
import type { JobData } from "./job-data";
import { useOnline } from "./use-live";

/**
 * Says plainly when this tablet's copy of the job is older than what the last sync reported (the
 * job changed on the server and the fresh copy could not be fetched yet). The tablet's own work
 * is still shown on top of the older copy; the copy is refreshed through the sync.
 */
export function CopyFreshness({ job }: { job: JobData }) {
  const { syncNow } = useBench();
  const online = useOnline();
  if (job.olderThanSync === null) return null;
  return (
    <div
      role="status"
      data-testid="copy-older"
      className="flex flex-wrap items-center gap-4 rounded-xl border-4 border-warn bg-warn-light p-3 text-warn"
    >
      <p className="flex-1 text-xl font-bold">
        <span aria-hidden="true">⟳ </span>
        Older copy: this tablet&apos;s copy of job #{job.snapshot.workOrder.number} is older than the last sync.{" "}
        {online ? "Refreshing it…" : "It refreshes when the network is back."} Your own work is shown on top.
      </p>
      {online && (
        <BigButton tone="plain" onClick={syncNow}>
          Refresh now
        </BigButton>
      )}
    </div>
  );
}
