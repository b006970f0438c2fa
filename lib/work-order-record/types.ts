/**
 * The shapes of a work order's record as the bench and the office read it: per step and per
 * stage, worked out from the server's snapshot with any work still on this tablet laid on top.
 */
import type { TorquePass } from "@/lib/calc/torque-stages";
import type { MeasurementUnit } from "@/lib/calc/units";
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
  /** Exactly as typed and stored, trailing zeros included ("0.030"). */
  value: string;
  unit: MeasurementUnit;
  verdict: "in" | "low" | "high";
  note: string;
  supersedesId: string | null;
  stamp: string;
  recordedBy: string;
  deviceId: string;
  pending: boolean;
}

/** Who took an entry back, when and why (the entry stays on record). */
export interface WithdrawalView {
  by: string;
  at: string;
  reason: string;
  /** Still on this tablet. */
  pending: boolean;
}

export interface TimerView {
  id: string;
  stepId: string;
  timerSpecId: string | null;
  label: string;
  durationS: number;
  startedAtMs: number;
  startedBy: string;
  endsAtMs: number;
  stoppedAtMs: number | null;
  stopReason: string | null;
  /** Stopped before its time was up: it never lets a held step go ahead. */
  stoppedEarly: boolean;
  overrideReason: string | null;
  overrideAtMs: number | null;
  /** Started by mistake and cancelled: it no longer counts. */
  cancelled: { reason: string } | null;
  /** Time left in ms (0 when done, stopped or cancelled). */
  remainingMs: number;
  /** Ran its full time, or was overridden. */
  done: boolean;
  pending: boolean;
}

/** A photo at a step: on record or waiting; a withdrawn one stays, marked, and no longer counts. */
export interface PhotoView {
  attachmentId: string;
  /** The operation that queued it (null for a photo the office added, or one stored before this was known). */
  operationId: string | null;
  takenBy: string | null;
  withdrawn: WithdrawalView | null;
}

/** One recorded bolt of one pass, for the record and the withdraw list. */
export interface BoltRecordView {
  operationId: string;
  passIndex: number;
  bolt: number;
  recordedBy: string;
  deviceTime: string;
  wrench: string | null;
  flagReason: string | null;
  withdrawn: WithdrawalView | null;
  pending: boolean;
}

/** A part fitted at a step: on the server, or waiting on this tablet; a withdrawn one stays, marked. */
export type PartView = Omit<Snapshot["state"]["parts"][number], "stepId" | "flagged" | "operationId"> & {
  operationId: string | null;
  pending: boolean;
  withdrawn: WithdrawalView | null;
};

export interface TorqueProgress {
  spec: TorqueSpecView;
  passes: TorquePass[];
  sequence: number[];
  /** "pass:bolt" of every bolt confirmed (withdrawn ones do not count). */
  confirmed: Set<string>;
  /** Every bolt recorded for this spec, withdrawn ones too, in the order recorded. */
  records: BoltRecordView[];
  /** The next bolt to tighten, or null when every pass is done. */
  next: { passIndex: number; bolt: number; positionInPass: number } | null;
  complete: boolean;
}

/** A timer on another step that must run out before a step may be worked on (lib/sync/holds.ts). */
export interface StepHold {
  label: string;
  /** Why the step is held: its timer not started, running, or stopped before its time. */
  why: "not-started" | "running" | "stopped-early";
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
  /** The completions that make it done (withdrawn ones left out), for the withdraw button. */
  completions: Array<{ operationId: string; by: string; at: string; pending: boolean }>;
  /** The supervisor sent it back and it has not been done again since. */
  reopened: { reason: string; decidedAt: string } | null;
  flagged: string | null;
  readings: Map<string, ReadingView[]>;
  /** Current reading per spec and reading index. */
  current: Map<string, Map<number, ReadingView>>;
  torque: TorqueProgress[];
  timers: TimerView[];
  /** A timer on another step that must run out before this step may be worked on. */
  blockedBy: StepHold | null;
  /** Photos that count (withdrawn ones left out). */
  photoCount: number;
  /** Every photo of the step, withdrawn ones too. */
  photos: PhotoView[];
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
  /** The sign-off that stands (`id`: the sign-off's id, the same on the tablet and on record; `by`: who signed). */
  signedOff: { at: string; pending: boolean; id: string; by: string } | null;
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
