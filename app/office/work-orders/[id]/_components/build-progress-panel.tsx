"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { formatDayTime } from "@/lib/format/dates";
import { STAGE_PROGRESS_LABELS, type BuildProgress, type StageProgressState } from "@/lib/work-orders/build-progress";
import { STATUS_LABELS } from "@/lib/work-orders/status";
import { noReasonGiven } from "@/lib/errors";

// A mark beside every state, so it never rests on colour alone.
const MARK: Record<StageProgressState, { mark: string; className: string }> = {
  not_started: { mark: "○", className: "text-steel-700" },
  in_progress: { mark: "◐", className: "text-ink" },
  ready_to_sign: { mark: "●", className: "text-ink" },
  waiting_review: { mark: "⧗", className: "text-warn" },
  sent_back: { mark: "↺", className: "text-fail" },
  approved: { mark: "✔", className: "text-pass" },
};

/** The bench record of the job as the office sees it: each stage's steps, sign-off and review. */
export function BuildProgressPanel({ workOrderId, number }: { workOrderId: string; number: number }) {
  const q = useQuery({
    queryKey: ["work-order", workOrderId, "progress"],
    queryFn: async () => {
      const res = await fetch(`/api/office/work-orders/${workOrderId}/progress`);
      const data = await res.json().catch(() => ({}));
      if (!res.ok) throw new Error(data.error ?? noReasonGiven(res.status));
      return data as BuildProgress;
    },
  });
  return (
    <section
      id="build-progress"
      className="rounded-xl border-2 border-steel-300 bg-white p-4"
      aria-labelledby="progress-heading"
      data-testid="build-progress"
    >
      <h2 id="progress-heading" className="text-2xl font-bold">
        Build progress
      </h2>
      {q.isLoading && <p className="text-lg">Loading…</p>}
      {q.isError && (
        <p role="alert" className="text-lg font-bold text-fail">
          {(q.error as Error).message}
        </p>
      )}
      {q.data && q.data.stages.length === 0 && <p className="text-lg">No procedures pinned yet: the bench has nothing to work through.</p>}
      {q.data && q.data.stages.length > 0 && (
        <>
          <p className="mt-1 text-lg" data-testid="progress-summary">
            {q.data.stepsDone} of {q.data.stepsTotal} steps done · {q.data.approvedStages} of {q.data.stages.length} stages approved ·{" "}
            {q.data.outOfTolerance === 0
              ? "no readings out of tolerance"
              : `${q.data.outOfTolerance} reading${q.data.outOfTolerance === 1 ? "" : "s"} out of tolerance`}
          </p>
          {q.data.due && (
            <p className="mt-2 rounded-lg border-2 border-steel-700 bg-signal/30 p-3 text-lg" data-testid="progress-due">
              <span className="font-bold">Next: move the job to “{STATUS_LABELS[q.data.due.to]}”.</span> {q.data.due.why}
            </p>
          )}
          <div className="mt-3 overflow-x-auto">
            <table className="w-full text-left text-lg">
              <thead>
                <tr className="border-b-2 border-steel-700">
                  <th className="py-2 pr-3">Stage</th>
                  <th className="py-2 pr-3">Steps</th>
                  <th className="py-2 pr-3">Out of tolerance</th>
                  <th className="py-2">Where it stands</th>
                </tr>
              </thead>
              <tbody>
                {q.data.stages.map((s) => (
                  <tr key={`${s.procedureName}|${s.key}`} className="border-b border-steel-300 align-top" data-testid="progress-stage">
                    <td className="py-2 pr-3">
                      <span className="font-bold">{s.title}</span>
                      <span className="block text-sm text-steel-700">{s.procedureName}</span>
                    </td>
                    <td className="py-2 pr-3 font-mono">
                      {s.stepsDone}/{s.stepsTotal}
                    </td>
                    <td className="py-2 pr-3">
                      {s.outOfTolerance === 0 ? "none" : <span className="font-bold text-fail">▲ {s.outOfTolerance}</span>}
                    </td>
                    <td className="py-2">
                      <span className={`font-bold ${MARK[s.state].className}`}>
                        <span aria-hidden="true">{MARK[s.state].mark}</span> {STAGE_PROGRESS_LABELS[s.state]}
                      </span>
                      {s.signedOffAt && <span className="block text-sm text-steel-700">signed off {formatDayTime(s.signedOffAt)}</span>}
                      {s.reason && <span className="block text-sm">“{s.reason}”</span>}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <p className="mt-2 flex flex-wrap gap-4 text-lg">
            <Link href="/review" className="underline">
              Review queue
            </Link>
            <Link href={`/audit?job=${number}`} className="underline">
              Audit trail of job #{number}
            </Link>
          </p>
        </>
      )}
    </section>
  );
}
