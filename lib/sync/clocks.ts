/**
 * The merge rules for time at the bench (`clock.on`, `clock.off`), kept beside the other rules of
 * ./merge-rules.ts, which calls these. Pure. The arithmetic of spans is in lib/clock/.
 *
 * - One open clock per mechanic: a clock-on while another clock of the same mechanic is running is
 *   kept and flagged; the earlier clock ends at the new clock-on's time (lib/clock/spans.ts). Nothing
 *   is dropped.
 * - A clock-off names its clock: only the mechanic on it may clock off (a supervisor closes a
 *   forgotten clock from review, with a reason); a clock-off before its clock-on is refused with
 *   the times; a clock-off whose clock-on has not reached the server is held until it does.
 * - A clock that ran longer than a working day is kept and flagged, to be checked.
 */
import { openClockAt, type ClockEndRecord, type ClockRecord } from "@/lib/clock/spans";
import { formatMinutes, spanMinutes } from "@/lib/clock/hours";
import type { Operation } from "./operations";

/** A clock known to the merge: on file, or clocked on earlier in the batch. */
export interface ClockFacts extends ClockRecord {
  /** The number of its work order, for the reasons. */
  workOrderNumber: number;
}

export interface ClockState {
  clocks: Map<string, ClockFacts>;
  ends: ClockEndRecord[];
}

/** A clock that ran longer than this is flagged for the supervisor (probably left running). */
export const LONG_CLOCK_MINUTES = 14 * 60;

const utc = (ms: number) => `${new Date(ms).toISOString().slice(0, 16).replace("T", " ")} UTC`;

/** What the clock-off names, when it is not on record (yet): held until its clock-on arrives. */
export function clockOffTarget(op: Operation): string | null {
  return op.kind === "clock.off" ? op.payload.clockId : null;
}

/** Why a clock operation does not fit the job or its clock (refused), or null. `missing` is true when the clock-on has not arrived. */
export function clockProblem(
  op: Operation,
  job: { id: string; number: number; stages: (jobProcedureId: string, stageKey: string) => boolean },
  state: ClockState,
): string | "missing" | null {
  if (op.kind === "clock.on") {
    const p = op.payload;
    if (state.clocks.has(p.clockId)) return `Clock ${p.clockId} is already on record.`;
    if (p.jobProcedureId !== undefined && p.stageKey !== undefined && !job.stages(p.jobProcedureId, p.stageKey)) {
      return `Stage "${p.stageKey}" of procedure ${p.jobProcedureId} is not on work order #${job.number}.`;
    }
    return null;
  }
  if (op.kind === "clock.off") {
    const clock = state.clocks.get(op.payload.clockId);
    if (!clock) return "missing";
    if (clock.workOrderId !== job.id) return `Clock ${op.payload.clockId} is not on work order #${job.number}.`;
    const end = Date.parse(op.payload.endedAt);
    if (end < clock.startedAtMs) {
      return `Clock-off at ${utc(end)} is before its clock-on at ${utc(clock.startedAtMs)}: a clock cannot end before it starts. Check the tablet's clock.`;
    }
  }
  return null;
}

/** Who may clock off: the mechanic on the clock only. */
export function clockAuthority(op: Operation, actorId: string, state: ClockState): string | null {
  if (op.kind !== "clock.off") return null;
  const clock = state.clocks.get(op.payload.clockId);
  if (!clock || clock.mechanicId === actorId) return null;
  return "Only the mechanic on this clock may clock off. A supervisor closes a forgotten clock from review, with a reason. Discard this entry with a reason.";
}

/** Kept, flagged: clocking on while another clock runs (it is ended at this clock-on's time); a clock that ran very long. */
export function clockFlags(op: Operation, state: ClockState): string[] {
  if (op.kind === "clock.on") {
    const at = Date.parse(op.payload.startedAt);
    const open = openClockAt(op.authorId, at, [...state.clocks.values()], state.ends);
    if (!open) return [];
    const earlier = state.clocks.get(open.id)!;
    return [
      `Clocked on while still on the clock on work order #${earlier.workOrderNumber} since ${utc(earlier.startedAtMs)}: that clock is ended at this clock-on's time (${utc(at)}).`,
    ];
  }
  if (op.kind === "clock.off") {
    const clock = state.clocks.get(op.payload.clockId);
    if (!clock) return [];
    const minutes = spanMinutes({ startedAtMs: clock.startedAtMs, endedAtMs: Date.parse(op.payload.endedAt) });
    if (minutes > LONG_CLOCK_MINUTES) {
      return [`This clock ran ${formatMinutes(minutes)}, longer than a working day: check it was not left running.`];
    }
  }
  return [];
}

/** Adds what a kept clock operation created to the state. */
export function noteClock(op: Operation, jobNumber: number, state: ClockState): void {
  if (op.kind === "clock.on") {
    state.clocks.set(op.payload.clockId, {
      id: op.payload.clockId,
      mechanicId: op.authorId,
      workOrderId: op.workOrderId,
      workOrderNumber: jobNumber,
      jobProcedureId: op.payload.jobProcedureId ?? null,
      stageKey: op.payload.stageKey ?? null,
      startedAtMs: Date.parse(op.payload.startedAt),
    });
  } else if (op.kind === "clock.off") {
    state.ends.push({ clockId: op.payload.clockId, kind: "clocked-off", endedAtMs: Date.parse(op.payload.endedAt) });
  }
}
