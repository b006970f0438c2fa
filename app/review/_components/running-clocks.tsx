"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { api } from "@/app/ui/api-client";
import { CloseClock } from "@/app/ui/hours-panel";
import type { RunningClock } from "@/db/bench/clocks";
import { formatMinutes } from "@/lib/clock/hours";
import { formatDayTime } from "@/lib/format/dates";

/** Clocks still running in the shop: a supervisor closes the forgotten ones, saying when the work stopped and why. */
export function RunningClocks({ canClose }: { canClose: boolean }) {
  const client = useQueryClient();
  const key = ["running-clocks"];
  const q = useQuery({ queryKey: key, queryFn: () => api<{ clocks: RunningClock[] }>("GET", "/api/review/running-clocks") });
  const [closing, setClosing] = useState<string | null>(null);
  const clocks = q.data?.clocks ?? [];
  return (
    <section
      className="mt-8 rounded-xl border-2 border-steel-300 bg-white p-4"
      aria-labelledby="running-heading"
      data-testid="running-clocks"
    >
      <h2 id="running-heading" className="text-2xl font-bold">
        Clocks running now
      </h2>
      {q.isError && (
        <p role="alert" className="text-lg font-bold text-fail">
          {(q.error as Error).message}
        </p>
      )}
      {q.data && clocks.length === 0 && <p className="text-lg">Nobody is on the clock.</p>}
      <ul className="mt-2 flex flex-col gap-2">
        {clocks.map((c) => (
          <li key={c.clockId} className="rounded-lg border-2 border-steel-300 p-3 text-lg" data-testid="running-clock">
            <span className="font-bold text-pass" aria-hidden="true">
              ●{" "}
            </span>
            <span className="font-bold">{c.mechanicName}</span> on job <span className="font-mono">#{c.workOrderNumber}</span>
            {c.stageKey ? ` (${c.stageKey})` : ""} since {formatDayTime(c.startedAt)} ·{" "}
            <span className="tabular-nums">{formatMinutes(c.minutes)}</span>
            {canClose && closing !== c.clockId && (
              <button type="button" className="ml-3 min-h-12 font-bold underline" onClick={() => setClosing(c.clockId)}>
                Close this clock with a reason
              </button>
            )}
            {closing === c.clockId && (
              <CloseClock
                jobId={c.workOrderId}
                clockId={c.clockId}
                onDone={() => {
                  setClosing(null);
                  void client.invalidateQueries({ queryKey: key });
                }}
              />
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
