/**
 * The shapes of a work order's record as the bench and the office read it: per step and per
 * stage, worked out from the server's snapshot with any work still on this tablet laid on top.
 */
import type { TorquePass } from "@/lib/calc/torque-stages";
import type { JobSnapshot } from "@/lib/sync/snapshot";

export type Snapshot = JobSnapshot;
export type ProcedureSnapshot = Snapshot["procedures"][number];
export type StageSnapshot = ProcedureSnapshot["stages"][number];
export type BenchStep = StageSnapshot["steps"][number];
export type TorqueSpecView = BenchStep["torqueSpecs"][number];
export type MeasurementSpecView = BenchStep["measurementSpecs"][number];

export interface ReadingView {
  id: string;
  specId: string;
  readingIndex: number;
  value: number;
  unit: "mm" | "in" | "µm";
  verdict: "in" | "low" | "high";
  note: string;
  supersedesId: string | null;
  stamp: string;
  recordedBy: string;
  deviceId: string;
  pending: boolean;
}

export interface TimerView {
  id: string;
  stepId: string;
  timerSpecId: string | null;
  label: string;
  durationS: number;
  startedAtMs: number;
  endsAtMs: number;
  stoppedAtMs: number | null;
  overrideReason: string | null;
  /** Time left in ms (0 when done). */
  remainingMs: number;
  done: boolean;
  pending: boolean;
}

/** A part fitted at a step: on the server, or waiting on this tablet. */
export type PartView = Omit<Snapshot["state"]["parts"][number], "stepId" | "flagged"> & { pending: boolean };

export interface TorqueProgress {
  spec: TorqueSpecView;
  passes: TorquePass[];
  sequence: number[];
  /** "pass:bolt" of every bolt confirmed. */
  confirmed: Set<string>;
  /** The next bolt to tighten, or null when every pass is done. */
  next: { passIndex: number; bolt: number; positionInPass: number } | null;
  complete: boolean;
}

/** A timer on another step that must run out before a step may be done. */
export interface StepHold {
  label: string;
  remainingMs: number;
  started: boolean;
  timerId: string | null;
  timerSpecId: string;
  stepId: string;
  durationS: number;
}

export interface StepView {
  step: BenchStep;
  stageKey: string;
  jobProcedureId: string;
  /** 0-based position in the job's whole step list. */
  index: number;
  done: boolean;
  donePending: boolean;
  /** The supervisor sent it back and it has not been done again since. */
  reopened: { reason: string; decidedAt: string } | null;
  flagged: string | null;
  readings: Map<string, ReadingView[]>;
  /** Current reading per spec and reading index. */
  current: Map<string, Map<number, ReadingView>>;
  torque: TorqueProgress[];
  timers: TimerView[];
  /** A timer on another step that must run out before this step may be done. */
  blockedBy: StepHold | null;
  photoCount: number;
  /** Parts fitted at this step, in the order they were fitted. */
  parts: PartView[];
  /** What must still be recorded before the step can be completed (empty when it can). */
  missing: string[];
}

export interface StageView {
  jobProcedureId: string;
  procedureName: string;
  key: string;
  title: string;
  steps: StepView[];
  allDone: boolean;
  /** The sign-off that stands (`id`: the sign-off's id, the same on the tablet and on record). */
  signedOff: { at: string; pending: boolean; id: string } | null;
  decision: { decision: "approved" | "sent_back"; reason: string } | null;
  canSignOff: boolean;
}

export interface WorkOrderView {
  stages: StageView[];
  steps: StepView[];
  doneCount: number;
  totalCount: number;
  outOfTolerance: number;
}
