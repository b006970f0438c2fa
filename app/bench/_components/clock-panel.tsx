"use client";

import { useState } from "react";
import { formatMinutes, spanMinutes } from "@/lib/clock/hours";
import { recordOperation } from "@/lib/client/bench-store";
import { announceNotSaved } from "@/lib/client/not-saved";
import { formatTime } from "@/lib/format/dates";
import type { JobSnapshot } from "@/lib/sync/snapshot";
import type { Operation } from "@/lib/sync/operations";
import { myClock } from "@/lib/work-order-record/clocks";
import { useAuthor, useBench } from "./bench-context";
import { BigButton } from "./big-button";
import { useNow } from "./use-live";

type StageChoice = { jobProcedureId: string; stageKey: string; title: string } | null;

/**
 * Time at the bench: whether you are on the clock on this job, and one big control to clock on
 * (the whole job, or a stage) or off. Works offline: each press is an entry in the outbox.
 */
export function ClockPanel({ snapshot, pending }: { snapshot: JobSnapshot; pending: readonly Operation[] }) {
  const nowMs = useNow(1000);
  const { db, user, syncNow } = useBench();
  const author = useAuthor();
  const [stage, setStage] = useState<StageChoice>(null);
  const [busy, setBusy] = useState(false);
  const jobId = snapshot.workOrder.id;
  const { running } = myClock(snapshot, pending, user.id, nowMs);
  const stages = snapshot.procedures.flatMap((p) =>
    p.stages.map((s) => ({ jobProcedureId: p.jobProcedureId, stageKey: s.key, title: s.title })),
  );
  const runningStage = running?.stageKey
    ? (stages.find((s) => s.jobProcedureId === running.jobProcedureId && s.stageKey === running.stageKey)?.title ?? running.stageKey)
    : null;

  async function press() {
    setBusy(true);
    try {
      const now = Date.now();
      if (running) {
        await recordOperation(db, author, jobId, "clock.off", { clockId: running.id, endedAt: new Date(now).toISOString() }, now);
      } else {
        await recordOperation(
          db,
          author,
          jobId,
          "clock.on",
          {
            clockId: crypto.randomUUID(),
            startedAt: new Date(now).toISOString(),
            ...(stage ? { jobProcedureId: stage.jobProcedureId, stageKey: stage.stageKey } : {}),
          },
          now,
        );
      }
      syncNow();
    } catch (e) {
      announceNotSaved(e);
    } finally {
      setBusy(false);
    }
  }

  return (
    <section
      aria-label="Time on this job"
      data-testid="clock-panel"
      className={`flex flex-col gap-4 rounded-xl border-4 p-4 ${running ? "border-pass bg-pass-light" : "border-steel-700 bg-white"}`}
    >
      <div className="flex flex-wrap items-center gap-4">
        <p className="flex flex-1 items-center gap-3 text-2xl font-bold" data-testid="clock-status" role="status">
          {running ? (
            <>
              <span aria-hidden="true" className="text-4xl text-pass">
                ●
              </span>
              <span>
                On the clock{runningStage ? ` · ${runningStage}` : ""} since {formatTime(running.startedAtMs)} (
                {formatMinutes(spanMinutes(running))}){running.pending ? " · waiting to send" : ""}
              </span>
            </>
          ) : (
            <>
              <span aria-hidden="true" className="text-4xl text-steel-700">
                ○
              </span>
              <span>Off the clock on this job</span>
            </>
          )}
        </p>
        <BigButton
          tone={running ? "danger" : "go"}
          disabled={busy}
          onClick={press}
          className="min-h-24 min-w-64 text-2xl"
          data-testid={running ? "clock-off" : "clock-on"}
        >
          <span aria-hidden="true">{running ? "■ " : "▶ "}</span>
          {running ? "Clock off" : stage ? `Clock on: ${stage.title}` : "Clock on this job"}
        </BigButton>
      </div>
      {!running && stages.length > 0 && (
        <fieldset className="flex flex-wrap gap-4">
          <legend className="mb-2 text-lg">Clock on for</legend>
          {[null, ...stages].map((s) => {
            const chosen = s === null ? stage === null : stage?.jobProcedureId === s.jobProcedureId && stage.stageKey === s.stageKey;
            return (
              <button
                key={s ? `${s.jobProcedureId}|${s.stageKey}` : "whole"}
                type="button"
                aria-pressed={chosen}
                onClick={() => setStage(s)}
                className={`min-h-target rounded-xl border-4 px-4 text-xl font-bold ${chosen ? "border-steel-900 bg-steel-900 text-white" : "border-steel-700 bg-white"}`}
              >
                <span aria-hidden="true">{chosen ? "◉ " : "○ "}</span>
                {s ? s.title : "The whole job"}
              </button>
            );
          })}
        </fieldset>
      )}
      {!running && <p className="text-lg">Clocking on here ends any clock of yours still running on another job.</p>}
    </section>
  );
}
