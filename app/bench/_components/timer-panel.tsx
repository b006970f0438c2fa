"use client";

import type { StepView } from "@/lib/bench/job-view";
import { recordOperation } from "@/lib/client/outbox";
import { useBench } from "./bench-context";
import { BigButton } from "./big-button";

export function clock(ms: number): string {
  const s = Math.ceil(ms / 1000);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const sec = s % 60;
  return `${h ? `${h}:` : ""}${String(m).padStart(h ? 2 : 1, "0")}:${String(sec).padStart(2, "0")}`;
}

/** Cure, heat-cycle and wait timers of a step. Time left is worked out from the start time, so a
 * timer carries on while the screen sleeps, the tab is closed or the tablet is offline. */
export function TimerPanel({ jobId, view }: { jobId: string; view: StepView }) {
  const { db, user, deviceId, syncNow } = useBench();
  async function start(spec: StepView["step"]["timerSpecs"][number]) {
    const now = Date.now();
    await recordOperation(
      db,
      { userId: user.id, deviceId },
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
  return (
    <div className="flex flex-col gap-3">
      {view.step.timerSpecs.map((spec) => {
        const t = view.timers.filter((x) => x.timerSpecId === spec.id).sort((a, b) => b.startedAtMs - a.startedAtMs)[0];
        return (
          <section key={spec.id} aria-label={`Timer ${spec.label}`} className="rounded-xl border-4 border-steel-700 bg-white p-4">
            <h3 className="text-2xl font-bold">Timer: {spec.label}</h3>
            <p className="text-lg">Runs for {clock(spec.durationS * 1000)}.</p>
            {!t && (
              <BigButton tone="go" className="mt-2" onClick={() => start(spec)}>
                Start the {clock(spec.durationS * 1000)} timer
              </BigButton>
            )}
            {t && !t.done && (
              <p className="mt-2 font-mono text-5xl font-bold" data-testid="timer-remaining" role="timer">
                {clock(t.remainingMs)} <span className="text-xl font-normal">left · ends {new Date(t.endsAtMs).toLocaleTimeString()}</span>
              </p>
            )}
            {t?.done && (
              <p className="mt-2 text-2xl font-bold text-pass" data-testid="timer-done">
                ✔ Timer done{t.overrideReason ? ` (overridden: ${t.overrideReason})` : ""}
              </p>
            )}
          </section>
        );
      })}
    </div>
  );
}
