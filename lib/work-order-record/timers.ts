/** Cure and heat-cycle timers, worked out from their start time, and the holds they put on other steps (lib/sync/holds.ts). */
import { holdAt } from "@/lib/sync/holds";
import type { PendingWork } from "./pending";
import type { ProcedureSnapshot, Snapshot, StepView, TimerView } from "./types";

interface TimerFacts {
  id: string;
  stepId: string;
  timerSpecId: string | null;
  label: string;
  durationS: number;
  startedAtMs: number;
  startedBy: string;
  stoppedAtMs: number | null;
  stopReason: string | null;
  overrideReason: string | null;
  overrideAtMs: number | null;
  cancelReason: string | null;
  pending: boolean;
}

function timerView(t: TimerFacts, nowMs: number): TimerView {
  const endsAtMs = t.startedAtMs + t.durationS * 1000;
  const stoppedEarly = t.stoppedAtMs !== null && t.stoppedAtMs < endsAtMs;
  const cancelled = t.cancelReason === null ? null : { reason: t.cancelReason };
  const overridden = t.overrideReason !== null;
  const remainingMs = cancelled || stoppedEarly || overridden ? 0 : Math.max(0, endsAtMs - nowMs);
  return {
    id: t.id,
    stepId: t.stepId,
    timerSpecId: t.timerSpecId,
    label: t.label,
    durationS: t.durationS,
    startedAtMs: t.startedAtMs,
    startedBy: t.startedBy,
    endsAtMs,
    stoppedAtMs: t.stoppedAtMs,
    stopReason: t.stopReason,
    stoppedEarly,
    overrideReason: t.overrideReason,
    overrideAtMs: t.overrideAtMs,
    cancelled,
    remainingMs,
    done: !cancelled && (overridden || (!stoppedEarly && endsAtMs <= nowMs)),
    pending: t.pending,
  };
}

const ms = (iso: string | null | undefined) => (iso ? Date.parse(iso) : null);

/** Every timer of the work order: on record (with any stop, cancel or override still waiting here), then waiting ones. */
export function timerViews(snapshot: Snapshot, work: PendingWork, nowMs: number): TimerView[] {
  const stopped = new Map<string, { at: number; reason: string | null }>();
  for (const o of work.ofKind("timer.stopped")) {
    const at = Date.parse(o.payload.stoppedAt);
    const held = stopped.get(o.payload.timerId);
    if (!held || at < held.at) stopped.set(o.payload.timerId, { at, reason: o.payload.reason ?? null });
  }
  const overridden = new Map<string, { reason: string; at: number }>();
  for (const o of work.ofKind("timer.overridden"))
    if (!overridden.has(o.payload.timerId)) overridden.set(o.payload.timerId, { reason: o.payload.reason, at: Date.parse(o.deviceTime) });
  const cancelled = new Map<string, string>();
  for (const o of work.ofKind("timer.cancelled")) if (!cancelled.has(o.payload.timerId)) cancelled.set(o.payload.timerId, o.payload.reason);

  const fromRecord = snapshot.state.timers.map((t): TimerFacts => {
    const stop = t.stoppedAt ? { at: Date.parse(t.stoppedAt), reason: t.stopReason ?? null } : (stopped.get(t.id) ?? null);
    const override = t.overrideReason
      ? { reason: t.overrideReason, at: ms(t.overrideAt) ?? Date.parse(t.startedAt) }
      : overridden.get(t.id);
    return {
      id: t.id,
      stepId: t.stepId,
      timerSpecId: t.timerSpecId,
      label: t.label,
      durationS: t.durationS,
      startedAtMs: Date.parse(t.startedAt),
      startedBy: t.startedBy,
      stoppedAtMs: stop?.at ?? null,
      stopReason: stop?.reason ?? null,
      overrideReason: override?.reason ?? null,
      overrideAtMs: override?.at ?? null,
      cancelReason: t.cancelReason ?? cancelled.get(t.id) ?? null,
      pending: false,
    };
  });
  const waiting = work.ofKind("timer.started").map((o): TimerFacts => {
    const p = o.payload;
    const override = overridden.get(p.timerId);
    return {
      id: p.timerId,
      stepId: p.stepId,
      timerSpecId: p.timerSpecId ?? null,
      label: p.label,
      durationS: p.durationS,
      startedAtMs: Date.parse(p.startedAt),
      startedBy: o.authorId,
      stoppedAtMs: stopped.get(p.timerId)?.at ?? null,
      stopReason: stopped.get(p.timerId)?.reason ?? null,
      overrideReason: override?.reason ?? null,
      overrideAtMs: override?.at ?? null,
      cancelReason: cancelled.get(p.timerId) ?? null,
      pending: true,
    };
  });
  return [...fromRecord, ...waiting].map((t) => timerView(t, nowMs));
}

/**
 * Sets `blockedBy` on the steps a timer spec of the procedure holds (by `blocksStepKey`, anywhere
 * in the procedure), by the one rule of lib/sync/holds.ts at `nowMs`.
 */
export function applyHolds(procSteps: StepView[], proc: ProcedureSnapshot, nowMs: number): void {
  const byKey = new Map<string, StepView>();
  for (const sv of procSteps) byKey.set(sv.step.key, sv);
  for (const sv of procSteps) {
    for (const spec of sv.step.timerSpecs) {
      if (!spec.blocksStepKey) continue;
      const target = byKey.get(spec.blocksStepKey);
      if (!target || !proc.stages.some((s) => s.steps.some((st) => st.id === target.step.id))) continue;
      const timers = sv.timers.filter((x) => x.timerSpecId === spec.id);
      const hold = holdAt(
        timers.map((t) => ({ ...t, cancelled: t.cancelled !== null })),
        nowMs,
      );
      if (!hold.held) continue;
      const on = { timerSpecId: spec.id, stepId: sv.step.id, durationS: spec.durationS };
      target.blockedBy =
        hold.why === "not-started"
          ? { label: spec.label, why: hold.why, remainingMs: spec.durationS * 1000, started: false, timerId: null, ...on }
          : {
              label: timers.find((t) => t.id === hold.timer.id)?.label ?? spec.label,
              why: hold.why,
              remainingMs: hold.why === "running" ? Math.max(0, hold.endsAtMs - nowMs) : 0,
              started: true,
              timerId: hold.timer.id,
              ...on,
            };
    }
  }
}
