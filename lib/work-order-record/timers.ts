/** Cure and heat-cycle timers, worked out from their start time, and the holds they put on later steps. */
import type { PendingWork } from "./pending";
import type { ProcedureSnapshot, Snapshot, StepView, TimerView } from "./types";

function timerView(
  id: string,
  stepId: string,
  timerSpecId: string | null,
  label: string,
  durationS: number,
  startedAtMs: number,
  stoppedAtMs: number | null,
  overrideReason: string | null,
  pending: boolean,
  nowMs: number,
): TimerView {
  const endsAtMs = startedAtMs + durationS * 1000;
  const remainingMs = Math.max(0, endsAtMs - nowMs);
  return {
    id,
    stepId,
    timerSpecId,
    label,
    durationS,
    startedAtMs,
    endsAtMs,
    stoppedAtMs,
    overrideReason,
    remainingMs,
    done: remainingMs === 0 || overrideReason !== null,
    pending,
  };
}

/** Every timer of the work order: on record (with any stop or override still waiting here), then waiting ones. */
export function timerViews(snapshot: Snapshot, work: PendingWork, nowMs: number): TimerView[] {
  const stopped = new Map<string, number>();
  for (const o of work.ofKind("timer.stopped")) stopped.set(o.payload.timerId, Date.parse(o.payload.stoppedAt));
  const overridden = new Map<string, string>();
  for (const o of work.ofKind("timer.overridden"))
    if (!overridden.has(o.payload.timerId)) overridden.set(o.payload.timerId, o.payload.reason);
  return [
    ...snapshot.state.timers.map((t) =>
      timerView(
        t.id,
        t.stepId,
        t.timerSpecId,
        t.label,
        t.durationS,
        Date.parse(t.startedAt),
        t.stoppedAt ? Date.parse(t.stoppedAt) : (stopped.get(t.id) ?? null),
        t.overrideReason ?? overridden.get(t.id) ?? null,
        false,
        nowMs,
      ),
    ),
    ...work
      .ofKind("timer.started")
      .map((o) =>
        timerView(
          o.payload.timerId,
          o.payload.stepId,
          o.payload.timerSpecId ?? null,
          o.payload.label,
          o.payload.durationS,
          Date.parse(o.payload.startedAt),
          stopped.get(o.payload.timerId) ?? null,
          overridden.get(o.payload.timerId) ?? null,
          true,
          nowMs,
        ),
      ),
  ];
}

/**
 * Sets `blockedBy` on the steps of one stage that a timer spec holds (by `blocksStepKey`): until
 * the latest timer of that spec has run out or been overridden, or while it was never started.
 */
export function applyHolds(stageSteps: StepView[], proc: ProcedureSnapshot): void {
  const stepKeyToId = new Map<string, string>();
  for (const s of proc.stages) for (const st of s.steps) stepKeyToId.set(st.key, st.id);
  for (const sv of stageSteps) {
    for (const spec of sv.step.timerSpecs) {
      if (!spec.blocksStepKey) continue;
      const blockedId = stepKeyToId.get(spec.blocksStepKey);
      const target = stageSteps.find((s) => s.step.id === blockedId) ?? null;
      if (!target) continue;
      const t = sv.timers.filter((x) => x.timerSpecId === spec.id).sort((a, b) => b.startedAtMs - a.startedAtMs)[0];
      const on = { timerSpecId: spec.id, stepId: sv.step.id, durationS: spec.durationS };
      if (!t) target.blockedBy = { label: spec.label, remainingMs: spec.durationS * 1000, started: false, timerId: null, ...on };
      else if (!t.done) target.blockedBy = { label: t.label, remainingMs: t.remainingMs, started: true, timerId: t.id, ...on };
    }
  }
}
