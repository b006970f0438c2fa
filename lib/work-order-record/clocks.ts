/**
 * Time at the bench as the tablet shows it: whether the signed-in mechanic is on the clock on this
 * job, from the job's copy with this tablet's clock-ons and clock-offs still on their way laid on
 * top. Pure; the rules are lib/clock/spans.ts.
 */
import { clockSpans, recordsOfJobClocks, type ClockRecord, type ClockSpan } from "@/lib/clock/spans";
import type { Operation } from "@/lib/sync/operations";
import type { Snapshot } from "./types";

export interface MyClock {
  /** The clock running now, on this job, or null (off the clock here). */
  running: (ClockSpan & { pending: boolean }) | null;
  /** Every span on this job, oldest first. */
  spans: ClockSpan[];
}

export function clocksOnJob(snapshot: Snapshot, pending: readonly Operation[], nowMs: number): ClockSpan[] {
  const jobId = snapshot.workOrder.id;
  const { clocks, ends } = recordsOfJobClocks(jobId, snapshot.state.clocks ?? []);
  const known = new Set(clocks.map((c) => c.id));
  for (const op of pending) {
    if (op.kind === "clock.on" && !known.has(op.payload.clockId)) {
      known.add(op.payload.clockId);
      clocks.push({
        id: op.payload.clockId,
        mechanicId: op.authorId,
        workOrderId: op.workOrderId,
        jobProcedureId: op.payload.jobProcedureId ?? null,
        stageKey: op.payload.stageKey ?? null,
        startedAtMs: Date.parse(op.payload.startedAt),
      });
    } else if (op.kind === "clock.off") {
      ends.push({ clockId: op.payload.clockId, kind: "clocked-off", endedAtMs: Date.parse(op.payload.endedAt) });
    }
  }
  // this tablet's clock-ons on other jobs end a clock here too
  const elsewhere: ClockRecord[] = pending
    .filter((op): op is Extract<Operation, { kind: "clock.on" }> => op.kind === "clock.on" && op.workOrderId !== jobId)
    .map((op) => ({
      id: op.payload.clockId,
      mechanicId: op.authorId,
      workOrderId: op.workOrderId,
      jobProcedureId: null,
      stageKey: null,
      startedAtMs: Date.parse(op.payload.startedAt),
    }));
  return clockSpans(clocks, ends, nowMs, [...clocks, ...elsewhere]);
}

/** Whether `userId` is on the clock on this job now. `pending` may hold other jobs' operations too. */
export function myClock(snapshot: Snapshot, pending: readonly Operation[], userId: string, nowMs: number): MyClock {
  const spans = clocksOnJob(snapshot, pending, nowMs);
  const onFile = new Set((snapshot.state.clocks ?? []).map((c) => c.id));
  const mine = spans.filter((s) => s.mechanicId === userId && s.running);
  const last = mine[mine.length - 1];
  return { running: last ? { ...last, pending: !onFile.has(last.id) } : null, spans };
}
