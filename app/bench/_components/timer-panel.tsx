"use client";

import type { StepView, TimerView } from "@/lib/work-order-record";
import { recordOperation } from "@/lib/client/bench-store";
import { useAuthor, useBench } from "./bench-context";
import { BigButton } from "./big-button";
import { ReasonAction } from "./reason-action";
import { formatTime } from "@/lib/format/dates";

export function clock(ms: number): string {
  const s = Math.ceil(ms / 1000);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const sec = s % 60;
  return `${h ? `${h}:` : ""}${String(m).padStart(h ? 2 : 1, "0")}:${String(sec).padStart(2, "0")}`;
}

/**
 * Cure, heat-cycle and wait timers of a step. Time left is worked out from the start time, so a
 * timer carries on while the screen sleeps, the tab is closed or the tablet is offline. A running
 * timer can be stopped (it ended early: the step it holds still waits) or cancelled (started by
 * mistake: it no longer counts), each with a reason; after either, the timer can be started again.
 */
export function TimerPanel({ jobId, view }: { jobId: string; view: StepView }) {
  const { db, user, syncNow } = useBench();
  const author = useAuthor();
  async function start(spec: StepView["step"]["timerSpecs"][number]) {
    const now = Date.now();
    await recordOperation(
      db,
      author,
      jobId,
      "timer.started",
      {
        timerId: crypto.randomUUID(),
        stepId: view.step.id,
        timerSpecId: spec.id,
        label: spec.label,
        durationS: spec.durationS,
        startedAt: new Date(now).toISOString(),
      },
      now,
    );
    syncNow();
  }
  async function stop(t: TimerView, reason: string) {
    await recordOperation(db, author, jobId, "timer.stopped", { timerId: t.id, stoppedAt: new Date().toISOString(), reason });
    syncNow();
  }
  async function cancel(t: TimerView, reason: string) {
    await recordOperation(db, author, jobId, "timer.cancelled", { timerId: t.id, reason });
    syncNow();
  }
  return (
    <div className="flex flex-col gap-3">
      {view.step.timerSpecs.map((spec) => {
        const ofSpec = view.timers.filter((x) => x.timerSpecId === spec.id).sort((a, b) => b.startedAtMs - a.startedAtMs);
        const counting = ofSpec.filter((x) => !x.cancelled);
        const t = counting[0];
        const running = t && !t.done && !t.stoppedEarly;
        const others = counting.filter((x) => x !== t && !x.done && !x.stoppedEarly);
        return (
          <section key={spec.id} aria-label={`Timer ${spec.label}`} className="rounded-xl border-4 border-steel-700 bg-white p-4">
            <h3 className="text-2xl font-bold">Timer: {spec.label}</h3>
            <p className="text-lg">Runs for {clock(spec.durationS * 1000)}.</p>
            {(!t || t.stoppedEarly) && (
              <BigButton tone="go" records className="mt-2" onClick={() => start(spec)}>
                {t ? "Start it again" : "Start"}: the {clock(spec.durationS * 1000)} timer
              </BigButton>
            )}
            {t?.stoppedEarly && (
              <p className="mt-2 text-xl font-bold text-warn" data-testid="timer-stopped">
                ■ Stopped before its time{t.stopReason ? `: “${t.stopReason}”` : ""}. The step it holds still waits.
              </p>
            )}
            {running && (
              <>
                <p className="mt-2 font-mono text-5xl font-bold" data-testid="timer-remaining" role="timer">
                  {clock(t.remainingMs)} <span className="text-xl font-normal">left · ends {formatTime(t.endsAtMs)}</span>
                </p>
                {others.length > 0 && (
                  <p className="mt-2 text-lg font-bold text-warn">
                    ⚑ Started {others.length + 1} times (on two tablets?): the step it holds waits for the last one. Cancel the one started
                    by mistake.
                  </p>
                )}
                <div className="mt-3 flex flex-wrap gap-4">
                  <ReasonAction
                    open="Stop this timer…"
                    title={`Stop “${t.label}” before its time? The step it holds keeps waiting until a timer runs its full time or a supervisor lets it go ahead.`}
                    confirm="Stop the timer"
                    testId="timer-stop"
                    onConfirm={(reason) => stop(t, reason)}
                  />
                  {(t.startedBy === user.id || user.role === "supervisor") && (
                    <ReasonAction
                      open="Cancel: started by mistake…"
                      title={`Cancel “${t.label}”? It stays on the record, marked cancelled, and no longer counts.`}
                      confirm="Cancel the timer"
                      testId="timer-cancel"
                      onConfirm={(reason) => cancel(t, reason)}
                    />
                  )}
                </div>
              </>
            )}
            {t?.done && (
              <p className="mt-2 text-2xl font-bold text-pass" data-testid="timer-done">
                ✔ Timer done{t.overrideReason ? ` (overridden: ${t.overrideReason})` : ""}
              </p>
            )}
            {ofSpec.some((x) => x.cancelled) && (
              <ul className="mt-2 text-lg" aria-label="Cancelled timers">
                {ofSpec
                  .filter((x) => x.cancelled)
                  .map((x) => (
                    <li key={x.id} className="text-steel-700">
                      ⊘ Started {formatTime(x.startedAtMs)}, cancelled: “{x.cancelled!.reason}”
                    </li>
                  ))}
              </ul>
            )}
          </section>
        );
      })}
    </div>
  );
}
