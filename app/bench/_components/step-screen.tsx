"use client";

import { useEffect, useRef, useState } from "react";
import { recordOperation } from "@/lib/client/bench-store";
import { useAuthor, useBench } from "./bench-context";
import { BigButton } from "./big-button";
import { Cautions } from "./cautions";
import { currentScreen, go, goFrom } from "./hash-route";
import { useJob } from "./job-data";
import { MeasurementPanel } from "./measurement-panel";
import { PartsFittedPanel } from "./parts-fitted-panel";
import { PhotoPanel } from "./photo-panel";
import { ProgressBar } from "./progress-bar";
import { CopyFreshness } from "./copy-freshness";
import { clock, TimerPanel } from "./timer-panel";
import { TimerOverride } from "./timer-override";
import { TorqueConfirmBar, TorquePanel } from "./torque-panel";
import { WithdrawEntry } from "./withdraw-entry";
import type { StepView } from "@/lib/work-order-record";

const SWIPE_PX = 90;

/** One step per screen: big previous/next at the screen edges, swipe to move, the step's
 * cautions, instructions and what must be recorded, then one large "done" button. */
export function StepScreen({ jobId, stepIndex }: { jobId: string; stepIndex: number }) {
  const { db, syncNow } = useBench();
  const author = useAuthor();
  const { data, loading, error } = useJob(jobId);
  const [acknowledged, setAcknowledged] = useState<Set<string>>(new Set());
  const touch = useRef<{ x: number; y: number } | null>(null);
  useEffect(() => {
    window.scrollTo(0, 0);
  }, [stepIndex]);

  if (loading) return <p className="p-6 text-xl">Loading the job…</p>;
  if (!data) return <p className="p-6 text-xl font-bold text-fail">{error ?? "Job not found."}</p>;
  const { view } = data;
  const total = view.steps.length;
  const sv = view.steps[Math.min(Math.max(stepIndex, 0), total - 1)];
  if (!sv) return <p className="p-6 text-xl">This job has no steps.</p>;
  const stage = view.stages.find((s) => s.jobProcedureId === sv.jobProcedureId && s.key === sv.stageKey)!;
  const hasPrev = sv.index > 0;
  const hasNext = sv.index < total - 1;
  const move = (d: number) => go({ screen: "step", jobId, stepIndex: sv.index + d });
  const cautionsOk = sv.step.cautions.length === 0 || acknowledged.has(sv.step.id) || sv.done;
  // While a timer holds the step, nothing is recorded on it (the server flags anything that gets through).
  const held = sv.blockedBy !== null;
  const canComplete = !sv.done && cautionsOk && sv.missing.length === 0 && !held;
  const lastCompletion = sv.completions.at(-1);

  async function complete() {
    const from = currentScreen();
    await recordOperation(db, author, jobId, "step.completed", { stepId: sv.step.id });
    syncNow();
    // The save takes a moment (IndexedDB may be busy with a sync): a mechanic who has tapped
    // "All steps" or another step meanwhile stays where they went, not pulled on to the next step.
    goFrom(from, hasNext ? { screen: "step", jobId, stepIndex: sv.index + 1 } : { screen: "job", jobId });
  }

  // The side buttons run the full height of the screen at both edges, within a thumb's reach.
  const edge =
    "no-print sticky top-0 flex h-[100dvh] w-20 shrink-0 items-center justify-center bg-steel-900 text-4xl font-bold text-white dim:bg-steel-100 dim:text-ink disabled:bg-steel-300 disabled:text-steel-700 md:w-24";
  return (
    <div
      className="flex items-start"
      onPointerDown={(e) => (touch.current = { x: e.clientX, y: e.clientY })}
      onPointerUp={(e) => {
        const t = touch.current;
        touch.current = null;
        if (!t) return;
        const dx = e.clientX - t.x;
        if (Math.abs(dx) > SWIPE_PX && Math.abs(e.clientY - t.y) < SWIPE_PX) {
          if (dx < 0 && hasNext) move(1);
          if (dx > 0 && hasPrev) move(-1);
        }
      }}
    >
      <button type="button" aria-label="Previous step" disabled={!hasPrev} onClick={() => move(-1)} className={edge}>
        <span aria-hidden="true">◀</span>
      </button>

      <div className="flex min-w-0 flex-1 flex-col gap-4 p-4">
        <div className="flex flex-wrap items-center gap-3">
          <BigButton tone="plain" onClick={() => go({ screen: "job", jobId })}>
            All steps
          </BigButton>
          <p className="text-lg">
            <span className="font-bold">
              Step {sv.index + 1} of {total}
            </span>{" "}
            · {stage.procedureName} · {stage.title}
          </p>
        </div>
        <ProgressBar done={view.doneCount} total={view.totalCount} />
        <CopyFreshness job={data} />
        <h1 className="text-4xl font-bold" data-testid="step-title">
          {sv.step.title}
        </h1>
        {sv.blockedBy && (
          <HoldBanner jobId={jobId} hold={sv.blockedBy} holder={view.steps.find((s) => s.step.id === sv.blockedBy!.stepId) ?? null} />
        )}
        {sv.reopened && (
          <p
            role="alert"
            data-testid="reopened-reason"
            className="rounded-xl border-4 border-fail bg-fail-light p-4 text-xl font-bold text-fail"
          >
            ↺ Sent back by the supervisor: {sv.reopened.reason}
          </p>
        )}
        {sv.flagged && (
          <p className="rounded-xl border-4 border-warn bg-warn-light p-3 text-lg font-bold text-warn">Flagged for review: {sv.flagged}</p>
        )}
        <Cautions
          cautions={sv.step.cautions}
          acknowledged={cautionsOk}
          onAcknowledge={() => setAcknowledged((s) => new Set(s).add(sv.step.id))}
        />
        {sv.step.instructions && <p className="max-w-4xl whitespace-pre-line text-2xl leading-snug">{sv.step.instructions}</p>}
        {sv.step.torqueSpecs.length > 0 && <TorquePanel jobId={jobId} view={sv} held={held} people={data.snapshot.people} />}
        {sv.step.measurementSpecs.length > 0 && <MeasurementPanel jobId={jobId} view={sv} held={held} />}
        {sv.step.timerSpecs.length > 0 && <TimerPanel jobId={jobId} view={sv} />}
        <PhotoPanel jobId={jobId} view={sv} snapshotPhotos={data.snapshot.state.photos} />
        <PartsFittedPanel key={sv.step.id} jobId={jobId} view={sv} job={view} people={data.snapshot.people} held={held} />

        <section aria-label="Finish the step" className="rounded-xl border-4 border-steel-900 bg-white p-4">
          {sv.done ? (
            <div className="flex flex-wrap items-center gap-4">
              <p className="flex-1 text-2xl font-bold text-pass" data-testid="step-done">
                ✔ Done{sv.donePending ? " — waiting to send" : ""}
              </p>
              {lastCompletion && (
                <WithdrawEntry
                  jobId={jobId}
                  operationId={lastCompletion.operationId}
                  recordedBy={lastCompletion.by}
                  what="“done” on this step"
                />
              )}
            </div>
          ) : (
            <>
              {held && <p className="mb-3 text-xl font-bold text-warn">⏳ On hold: see the top of the step.</p>}
              {!cautionsOk && <p className="mb-3 text-xl font-bold">Read the cautions above first.</p>}
              {sv.missing.length > 0 && (
                <ul className="mb-3 list-inside list-disc text-xl" data-testid="step-missing">
                  {sv.missing.map((m) => (
                    <li key={m}>{m}</li>
                  ))}
                </ul>
              )}
              <BigButton tone="go" records disabled={!canComplete} onClick={complete} className="min-h-24 w-full text-2xl">
                Step done
              </BigButton>
            </>
          )}
        </section>
        {!sv.done && <TorqueConfirmBar jobId={jobId} view={sv} held={held} />}
      </div>

      <button type="button" aria-label="Next step" disabled={!hasNext} onClick={() => move(1)} className={edge}>
        <span aria-hidden="true">▶</span>
      </button>
    </div>
  );
}

/**
 * The hold, at the top of the held step: what it waits for, how long, and that recording is off
 * until then (colour, words and the hourglass together). A supervisor can let it go ahead here.
 */
function HoldBanner({ jobId, hold, holder }: { jobId: string; hold: NonNullable<StepView["blockedBy"]>; holder: StepView | null }) {
  const where = holder ? ` on step ${holder.index + 1}, “${holder.step.title}”` : "";
  const why =
    hold.why === "running"
      ? `${clock(hold.remainingMs)} left`
      : hold.why === "stopped-early"
        ? `its timer was stopped before its time; start it again${where}`
        : `its timer has not been started yet; start it${where}`;
  return (
    <section aria-label="On hold" className="rounded-xl border-4 border-warn bg-warn-light p-4 text-ink" data-testid="step-hold">
      <p className="text-2xl font-bold text-warn" data-testid="step-blocked">
        <span aria-hidden="true">⏳ </span>On hold — waiting for “{hold.label}”: {why}.
      </p>
      <p className="mt-1 text-xl">Recording on this step is switched off until then. Only a supervisor can let it go ahead sooner.</p>
      <div className="mt-3">
        <TimerOverride jobId={jobId} blocked={hold} />
      </div>
    </section>
  );
}
