/**
 * The merge rules, as pure functions. db/sync/merge.ts loads the facts, calls `decideOperation` for each
 * operation in stamp order (calling `noteAccepted` after each one it keeps), and writes the result.
 * The rules in plain words are in ./README.md.
 */
import { canReach, type Role } from "@/lib/auth/roles";
import { sameMeasurementKind, type MeasurementUnit } from "@/lib/calc/units";
import { isClosed, isOpenForBenchWork, STATUS_LABELS, type WorkOrderStatus } from "@/lib/work-orders/status";
import { compareStamps, parseStamp } from "./hlc";
import { clockAuthority, clockFlags, clockProblem, noteClock, type ClockState } from "./clocks";
import { describeHold, holdAt, runningAt, type HoldTimer } from "./holds";
import type { Operation } from "./operations";
import { partSerialOnWorkOrder, repeatedSerialReason, type SerialOnFile } from "./parts";
import { withdrawalRefusal, type EntryFacts, type TargetLookup } from "./withdrawals";

/** A stamp further ahead of the server's clock than this is kept but flagged (the tablet's clock is likely wrong). */
export const MAX_CLOCK_AHEAD_MS = 5 * 60_000;

export interface Actor {
  id: string;
  shopId: string;
  role: Role;
}

export interface StepFacts {
  key: string;
  title: string;
  jobProcedureId: string;
  stageKey: string;
}
export interface MeasurementSpecFacts {
  stepId: string;
  label: string;
  /** The spec's unit: a reading must be of the same kind (a length for a length, cc for cc). */
  unit: MeasurementUnit;
  /** How many readings the spec takes (its reading labels; 1 when it has none). */
  readingCount: number;
}
export interface TorqueSpecFacts {
  stepId: string;
  label: string;
  boltCount: number;
  /** Torque passes (1 when the spec lists none) plus angle passes. */
  passCount: number;
  /** Stretch bolts: a bolt recorded twice is flagged louder. */
  torqueToYield?: boolean;
}
export interface TimerSpecFacts {
  stepId: string;
}
/** A timer spec holding back a step (its `blocksStepKey`), keyed by the held step. */
export interface HoldFacts {
  timerSpecId: string;
  label: string;
}
/** A supervisor's send-back decision on this job. */
export interface SendBackFacts {
  decisionId: string;
  stepIds: readonly string[];
  /** Its place in the change sequence (shared with operations.seq). */
  seq: number;
  decidedAtMs: number;
  reason: string;
}

/** What the merge knows about one work order: the job, and the procedures pinned on it. */
export interface WorkOrderFacts {
  id: string;
  shopId: string;
  number: number;
  status: WorkOrderStatus;
  assignedMechanicId: string | null;
  /** The assigned mechanic's name, for the reason a flag gives. */
  assignedMechanicName?: string | null;
  /** When the job was last (re)assigned, ms; null or absent when not known. */
  assignedSinceMs?: number | null;
  steps: ReadonlyMap<string, StepFacts>;
  measurementSpecs: ReadonlyMap<string, MeasurementSpecFacts>;
  torqueSpecs: ReadonlyMap<string, TorqueSpecFacts>;
  timerSpecs: ReadonlyMap<string, TimerSpecFacts>;
  sendBacks: readonly SendBackFacts[];
  /** Held step id → the timer specs that hold it (none when absent). */
  holds?: ReadonlyMap<string, readonly HoldFacts[]>;
  /** Stages whose latest decision (on a sign-off still standing) is an approval, as `approvedStageKey`s. */
  approvedStages?: ReadonlySet<string>;
}

/** A stage's key in `WorkOrderFacts.approvedStages`. */
export const approvedStageKey = (jobProcedureId: string, stageKey: string) => `${jobProcedureId}|${stageKey}`;

/** A timer on record (or started earlier in the batch), with what the hold rule needs (./holds.ts). */
export interface TimerFacts extends HoldTimer {
  workOrderId: string;
  timerSpecId: string | null;
  startedBy: string;
}

/** A torque bolt that counts (not withdrawn), for the "recorded twice" check. */
export interface BoltOnFile {
  id: string;
  deviceId: string;
  deviceTime: string;
}

/** Records operations may refer to: those on file that the batch names, plus those accepted earlier in it. */
export interface MergeState {
  readings: Map<string, { workOrderId: string; specId: string; readingIndex: number }>;
  /** Timers the batch names and every timer of the batch's jobs (for holds). */
  timers: Map<string, TimerFacts>;
  attachmentIds: Set<string>;
  /** Part record ids (parts_fitted.id) in use. */
  partIds: Set<string>;
  /** Serial-numbered parts on the batch's jobs, by `partSerialOnWorkOrder` (./parts.ts). */
  partSerials: Map<string, SerialOnFile>;
  /** Torque bolts that count on the batch's jobs, by `boltKey`. */
  bolts: Map<string, BoltOnFile[]>;
  /** Entries a withdrawal may name: those the batch names on file, and every one accepted earlier in the batch. */
  entries: Map<string, EntryFacts>;
  /** Clocks of the batch's authors (one open clock per mechanic) and the ends on record (./clocks.ts). */
  clock: ClockState;
  /**
   * Work on file (not withdrawn) on the steps of jobs whose timers the batch stops or cancels, with
   * the wall time of its stamp: a stop that arrives late may put some of it inside the hold.
   */
  stepWork?: Map<string, ReadonlyArray<{ opId: string; stepId: string; atMs: number }>>;
}

export function emptyMergeState(): MergeState {
  return {
    readings: new Map(),
    timers: new Map(),
    attachmentIds: new Set(),
    partIds: new Set(),
    partSerials: new Map(),
    bolts: new Map(),
    entries: new Map(),
    clock: { clocks: new Map(), ends: [] },
  };
}

/** The key of one bolt of one pass of one torque spec on one job. */
export const boltKey = (workOrderId: string, torqueSpecId: string, passIndex: number, bolt: number) =>
  `${workOrderId}|${torqueSpecId}|${passIndex}:${bolt}`;

export interface DecisionInput {
  actor: Actor;
  /** The device the batch came from. */
  batchDeviceId: string;
  /** The cursor the batch was sent with (null: the device had never synced). */
  cursor: number | null;
  /** The server's clock, ms. */
  nowMs: number;
  /** The work order the operation names; undefined when there is none. */
  job: WorkOrderFacts | undefined;
  state: MergeState;
}

/** A record an operation acts on, which must be on file before it can be applied. */
export interface Target {
  /** A reading a correction names, a timer a stop, override or cancel names, an entry a withdrawal names, a clock a clock-off names. */
  kind: "reading" | "timer" | "entry" | "clock";
  id: string;
}

/**
 * accept; accept flagged for review (with why); refuse (with why, for the mechanic to act on);
 * or wait: everything checks out but the record it acts on (`target`) has not arrived yet, so it
 * is held on the server and applied when that record arrives.
 */
export type Decision =
  | { outcome: "accept" }
  | { outcome: "flag"; reason: string }
  | { outcome: "refuse"; reason: string }
  | { outcome: "wait"; reason: string; target: Target };

const accept: Decision = { outcome: "accept" };
const refuse = (reason: string): Decision => ({ outcome: "refuse", reason });
/** What the mechanic does with an entry that names something not on the job. */
const NOT_ON_JOB = "Discard this entry with a reason; record the work again on the job as it is now.";

/**
 * Who may record bench work on a job: a user whose role reaches the bench, in the job's shop;
 * a supervisor on any job of the shop; a mechanic on a job assigned to them or assigned to nobody.
 */
export function mayWorkOn(actor: Actor, job: { shopId: string; assignedMechanicId: string | null }): boolean {
  if (actor.shopId !== job.shopId || !canReach(actor.role, "bench")) return false;
  if (actor.role !== "mechanic") return true;
  return job.assignedMechanicId === null || job.assignedMechanicId === actor.id;
}

/** Operations in the order the merge applies them: by stamp, then by id. */
export function sortByStamp<T extends { stamp: string; id: string }>(ops: readonly T[]): T[] {
  return [...ops].sort((a, b) => compareStamps(a.stamp, b.stamp) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
}

/** Whether the device could not have known of a send-back when it made an operation. */
function sendBackUnseen(sendBack: SendBackFacts, opWallMs: number, cursor: number | null): boolean {
  return cursor === null || sendBack.seq > cursor || opWallMs < sendBack.decidedAtMs;
}

/**
 * Decides one operation: accept it, accept it flagged for review, refuse it, or hold it until the
 * record it acts on arrives. Refused are only forgery (author, device or stamp not the sender's),
 * a role that may not do it (a timer override by someone who is not a supervisor), and structure
 * (a job outside the shop, a step, spec, reading, timer or stage that is not on the job, an id used
 * twice); work on a job closed, not open for bench work or assigned to someone else is kept and
 * flagged with the reason.
 */
export function decideOperation(op: Operation, input: DecisionInput): Decision {
  const { actor, job } = input;
  if (op.authorId !== actor.id) {
    return refuse(
      `The operation names author ${op.authorId}, who is not the signed-in user: a tablet may only send its own user's work. Sign in as that person to send it, or discard it with a reason.`,
    );
  }
  if (op.deviceId !== input.batchDeviceId) {
    return refuse(
      `The operation was made on device "${op.deviceId}" but sent in a batch from device "${input.batchDeviceId}": only the tablet that recorded it may send it. Discard it with a reason.`,
    );
  }
  const stamp = parseStamp(op.stamp);
  if (stamp.deviceId !== op.deviceId) {
    return refuse(`The operation's stamp was made by device "${stamp.deviceId}", not by "${op.deviceId}". Discard it with a reason.`);
  }
  if (!canReach(actor.role, "bench")) return refuse(`Your role (${actor.role}) may not record bench work.`);
  if (!job || job.shopId !== actor.shopId) return refuse(`Work order ${op.workOrderId} is not in your shop. ${NOT_ON_JOB}`);

  if (op.kind === "timer.overridden" && actor.role !== "supervisor") {
    return refuse(
      "Only a supervisor may override a timer. Ask the office to give you the supervisor role and send it again, or discard it with a reason.",
    );
  }

  const problem = checkReferences(op, job, input.state);
  if (typeof problem === "string") return refuse(`${problem} ${NOT_ON_JOB}`);
  const authority = checkAuthority(op, actor, job, input.state);
  if (authority) return refuse(authority);

  const flags = [...jobFlags(job), ...assignmentFlags(op, actor, job)];
  if (stamp.wallMs > input.nowMs + MAX_CLOCK_AHEAD_MS) {
    const minutes = Math.round((stamp.wallMs - input.nowMs) / 60_000);
    flags.push(`Its stamp is ${minutes} min ahead of the server clock: check the tablet's clock.`);
  }
  flags.push(...sendBackFlags(op, job, stamp.wallMs, input.cursor));
  flags.push(...partFlags(op, job, input.state));
  flags.push(...repeatedBoltFlags(op, job, input.state));
  flags.push(...holdFlags(op, job, input.state, stamp.wallMs));
  flags.push(...secondTimerFlags(op, job, input.state));
  flags.push(...lateStopFlags(op, job, input.state));
  flags.push(...withdrawalFlags(op, job, input.state));
  flags.push(...afterApprovalFlags(op, job));
  flags.push(...clockFlags(op, input.state.clock));
  // Held only once everything else checks out; the flags are worked out again when it is applied.
  if (problem) return { outcome: "wait", ...problem };
  return flags.length ? { outcome: "flag", reason: flags.join(" ") } : accept;
}

/** Work by a mechanic on a job assigned to someone else: kept, flagged with who has it (and since when, if after the work). */
function assignmentFlags(op: Operation, actor: Actor, job: WorkOrderFacts): string[] {
  if (mayWorkOn(actor, job)) return [];
  const who = job.assignedMechanicName || "another mechanic";
  const since = job.assignedSinceMs ?? null;
  const madeAt = Date.parse(op.deviceTime);
  if (since !== null && since > madeAt) {
    return [
      `Work order #${job.number} was reassigned to ${who} at ${new Date(since).toISOString()}, after this was recorded; kept for the supervisor to check.`,
    ];
  }
  return [`Work order #${job.number} is assigned to ${who}, not to the mechanic who recorded this; kept for the supervisor to check.`];
}

const utc = (iso: string | number) => `${new Date(iso).toISOString().slice(0, 16).replace("T", " ")} UTC`;

/**
 * Two tablets on one bolt: a bolt and pass already recorded on the job (and not withdrawn) is kept
 * and flagged; for a torque-to-yield bolt the flag says so first, in capitals.
 */
function repeatedBoltFlags(op: Operation, job: WorkOrderFacts, state: MergeState): string[] {
  if (op.kind !== "torque.bolt-confirmed") return [];
  const p = op.payload;
  const earlier = state.bolts.get(boltKey(job.id, p.torqueSpecId, p.passIndex, p.bolt)) ?? [];
  if (!earlier.length) return [];
  const spec = job.torqueSpecs.get(p.torqueSpecId)!;
  const first = earlier[0];
  const what = `Bolt ${p.bolt}, pass ${p.passIndex} of “${spec.label}” was already recorded (tablet ${first.deviceId}, ${utc(first.deviceTime)}) and is recorded again`;
  return spec.torqueToYield
    ? [
        `TORQUE-TO-YIELD BOLT RECORDED TWICE: ${what}. A stretch bolt tightened again may be past its yield point: check it, and fit a new bolt if in doubt.`,
      ]
    : [`${what}: check it was not tightened twice.`];
}

/** The timers of a job for one timer spec. */
function timersOfSpec(state: MergeState, jobId: string, timerSpecId: string): TimerFacts[] {
  return [...state.timers.values()].filter((t) => t.workOrderId === jobId && t.timerSpecId === timerSpecId);
}

/** Kinds of work on a step that a hold stops (./holds.ts). */
export const HELD_WORK_KINDS = ["step.completed", "torque.bolt-confirmed", "measurement.recorded", "part.fitted"] as const;
type HeldWork = Extract<Operation, { kind: (typeof HELD_WORK_KINDS)[number] }>;
const isHeldWork = (op: Operation): op is HeldWork => (HELD_WORK_KINDS as readonly string[]).includes(op.kind);

/** Kinds of work that change a step's record: those a hold stops, and a photo. Recorded on a stage the supervisor approved, they are flagged. */
export const STEP_RECORD_KINDS = [...HELD_WORK_KINDS, "photo.queued"] as const;

/** The step an operation adds to the record of, when it does (`STEP_RECORD_KINDS`). */
export function recordedStep(op: Operation): string | null {
  return op.kind === "photo.queued" ? op.payload.stepId : heldWorkStep(op);
}

/**
 * Work recorded on a step whose stage the supervisor has approved (a correction of a reading,
 * another tablet's reading of the same spot, a part, a bolt, a photo, the step done again): the
 * approved record is no longer the record, so it is kept and flagged, and the stage goes back to
 * the review queue and the handover gate until the supervisor accepts it, as a withdrawal does.
 */
function afterApprovalFlags(op: Operation, job: WorkOrderFacts): string[] {
  const step = stepOfApprovedStage(job, recordedStep(op));
  if (!step) return [];
  return [
    `Recorded on step “${step.title}” after the supervisor approved its stage: the approved record has changed, so the stage is checked again.`,
  ];
}

/** The step, when it is on the job and its stage's standing decision is an approval. */
function stepOfApprovedStage(job: WorkOrderFacts, stepId: string | null | undefined): StepFacts | undefined {
  const step = stepId ? job.steps.get(stepId) : undefined;
  return step && job.approvedStages?.has(approvedStageKey(step.jobProcedureId, step.stageKey)) ? step : undefined;
}

/** The step an operation records work on, when it is work a hold stops (./holds.ts). */
function heldWorkStep(op: Operation): string | null {
  return isHeldWork(op) ? op.payload.stepId : null;
}

/** Holds hold: work on a held step stamped before the hold ended (or was overridden) is kept and flagged. */
function holdFlags(op: Operation, job: WorkOrderFacts, state: MergeState, atMs: number): string[] {
  const stepId = heldWorkStep(op);
  const holds = stepId === null ? undefined : job.holds?.get(stepId);
  if (!holds?.length) return [];
  const out: string[] = [];
  for (const h of holds) {
    const hold = holdAt(timersOfSpec(state, job.id, h.timerSpecId), atMs);
    if (!hold.held) continue;
    const step = job.steps.get(stepId!)!;
    out.push(
      `Step “${step.title}” was on hold when this was recorded (${utc(atMs)}): ${describeHold(h.label, hold)}. Check the wait was kept before this work.`,
    );
  }
  return out;
}

/**
 * A timer stopped early or cancelled, arriving after work on the step it holds was accepted: that
 * work was accepted because the server thought the wait had run its time (or a later timer stood),
 * but with this stop it falls inside the hold. The stop is kept and flagged, naming the work, so
 * the supervisor checks the wait was kept (had the stop come first, the work itself would have
 * been flagged).
 */
function lateStopFlags(op: Operation, job: WorkOrderFacts, state: MergeState): string[] {
  if (op.kind !== "timer.stopped" && op.kind !== "timer.cancelled") return [];
  const timer = state.timers.get(op.payload.timerId);
  if (!timer || timer.workOrderId !== job.id || timer.timerSpecId === null) return [];
  const heldSteps = [...(job.holds ?? new Map<string, readonly HoldFacts[]>())]
    .filter(([, hs]) => hs.some((h) => h.timerSpecId === timer.timerSpecId))
    .map(([stepId, hs]) => ({ stepId, label: hs.find((h) => h.timerSpecId === timer.timerSpecId)!.label }));
  if (!heldSteps.length) return [];
  const before = timersOfSpec(state, job.id, timer.timerSpecId);
  const changed: TimerFacts =
    op.kind === "timer.cancelled"
      ? { ...timer, cancelled: true }
      : { ...timer, stoppedAtMs: Math.min(timer.stoppedAtMs ?? Infinity, Date.parse(op.payload.stoppedAt)) };
  const after = before.map((t) => (t.id === timer.id ? changed : t));
  const out: string[] = [];
  for (const { stepId, label } of heldSteps) {
    const now = (state.stepWork?.get(job.id) ?? []).filter(
      (w) => w.stepId === stepId && !holdAt(before, w.atMs).held && holdAt(after, w.atMs).held,
    );
    if (!now.length) continue;
    const step = job.steps.get(stepId);
    const first = Math.min(...now.map((w) => w.atMs));
    out.push(
      `“${label}” was ${op.kind === "timer.cancelled" ? "cancelled" : "stopped before its time was up"}, and this reached the server after ${now.length === 1 ? "work" : `${now.length} entries of work`} on step “${step?.title ?? stepId}” (from ${utc(first)}) had been accepted as done after the wait: that work was recorded while the step was on hold. Check the wait was kept.`,
    );
  }
  return out;
}

/**
 * Two tablets starting the same wait: both timers are kept (none is merged away) and the second is
 * flagged; the step it holds waits for the later one (./holds.ts).
 */
function secondTimerFlags(op: Operation, job: WorkOrderFacts, state: MergeState): string[] {
  if (op.kind !== "timer.started" || op.payload.timerSpecId === undefined) return [];
  const at = Date.parse(op.payload.startedAt);
  const ends = at + op.payload.durationS * 1000;
  const others = timersOfSpec(state, job.id, op.payload.timerSpecId).filter((t) => t.id !== op.payload.timerId);
  const before = others.find((t) => runningAt(t, at));
  if (before) {
    return [
      `A second “${op.payload.label}” timer was started while one started at ${utc(before.startedAtMs)} was still running: both are kept, and the step it holds waits for the later one to run out.`,
    ];
  }
  // arrived after a timer of the same spec that was started later, while this one would still run
  const after = others.find((t) => !t.cancelled && t.startedAtMs >= at && t.startedAtMs < ends);
  if (!after) return [];
  return [
    `A second “${op.payload.label}” timer was started at ${utc(after.startedAtMs)} while this one (started at ${utc(at)}) was still running, and reached the server first: both are kept, and the step it holds waits for the later one to run out.`,
  ];
}

/**
 * Withdrawals the supervisor must see, since they change what a decision stood on:
 * - a sign-off a supervisor had decided on (the stage needs a new sign-off and review);
 * - work on a step whose stage the supervisor has approved: the approved record is no longer the
 *   record, so the stage goes back to the review queue (and the handover gate) until they accept it;
 * - an entry that was itself flagged and not yet accepted: withdrawing it must not make the flag
 *   (a stretch bolt tightened twice, work during a hold) disappear from review.
 */
function withdrawalFlags(op: Operation, job: WorkOrderFacts, state: MergeState): string[] {
  if (op.kind !== "entry.withdrawn") return [];
  const entry = state.entries.get(op.payload.operationId);
  if (!entry) return [];
  const flags: string[] = [];
  if (entry.kind === "stage.signed-off" && entry.decided) {
    flags.push(
      "This stage sign-off had already been decided on by a supervisor when it was withdrawn: the stage needs a new sign-off and review.",
    );
  }
  const step = stepOfApprovedStage(job, entry.stepId);
  if (step) {
    flags.push(
      `Withdrawn from step “${step.title}” after the supervisor approved its stage: the approved record has changed, so the stage is checked again.`,
    );
  }
  if (entry.flaggedOpen) {
    flags.push(
      "The entry withdrawn had been flagged for the supervisor and not yet accepted: the supervisor sees it with this withdrawal.",
    );
  }
  return flags;
}

/** The timer an operation names, on this job. "Not found" may one day mean "not here yet". */
export function timerTarget(timerId: string, job: { id: string; number: number }, state: MergeState): TargetLookup<TimerFacts> {
  const timer = state.timers.get(timerId);
  if (!timer || timer.workOrderId !== job.id)
    return { found: false, reason: `Timer ${timerId} is not on record on work order #${job.number}.` };
  return { found: true, target: timer };
}

/**
 * Who may take something back: withdrawals and timer cancels name an entry of the author's own, or
 * come from a supervisor. One whose entry or timer has not arrived waits for it (checkReferences):
 * its author is checked when it is applied.
 */
function checkAuthority(op: Operation, actor: Actor, job: WorkOrderFacts, state: MergeState): string | null {
  const clock = clockAuthority(op, actor.id, state.clock);
  if (clock) return clock;
  if (op.kind === "entry.withdrawn") {
    const entry = state.entries.get(op.payload.operationId);
    return entry && entry.workOrderId === job.id ? withdrawalRefusal(actor, entry) : null;
  }
  if (op.kind === "timer.cancelled") {
    const found = timerTarget(op.payload.timerId, job, state);
    if (!found.found) return null;
    if (found.target.startedBy !== actor.id && actor.role !== "supervisor") {
      return "Only the person who started this timer, or a supervisor, may cancel it: a mechanic cannot cancel someone else's timer.";
    }
  }
  return null;
}

function jobFlags(job: WorkOrderFacts): string[] {
  const label = STATUS_LABELS[job.status] ?? job.status;
  if (isClosed(job.status)) return [`Work order #${job.number} is closed (${label}); kept for review.`];
  if (!isOpenForBenchWork(job.status)) return [`Work order #${job.number} is not open for bench work (${label}); kept for review.`];
  return [];
}

function sendBackFlags(op: Operation, job: WorkOrderFacts, opWallMs: number, cursor: number | null): string[] {
  if (op.kind === "step.completed") {
    const step = job.steps.get(op.payload.stepId)!;
    const hit = job.sendBacks.find((s) => s.stepIds.includes(op.payload.stepId) && sendBackUnseen(s, opWallMs, cursor));
    return hit
      ? [
          `Step "${step.title}" was sent back by the supervisor (${new Date(hit.decidedAtMs).toISOString()}: ${hit.reason}) and this completion was made before the tablet knew; check the step was redone.`,
        ]
      : [];
  }
  if (op.kind === "stage.signed-off") {
    const { jobProcedureId, stageKey } = op.payload;
    const hit = job.sendBacks.find(
      (s) =>
        sendBackUnseen(s, opWallMs, cursor) &&
        s.stepIds.some((id) => {
          const step = job.steps.get(id);
          return step?.jobProcedureId === jobProcedureId && step.stageKey === stageKey;
        }),
    );
    return hit
      ? [
          `Stage "${stageKey}" had steps sent back by the supervisor (${new Date(hit.decidedAtMs).toISOString()}: ${hit.reason}) that the tablet did not know of when signing off.`,
        ]
      : [];
  }
  return [];
}

/** A serial-numbered part already recorded on the job (on file, or earlier in the batch) is kept and flagged. */
function partFlags(op: Operation, job: WorkOrderFacts, state: MergeState): string[] {
  if (op.kind !== "part.fitted" || op.payload.serial === undefined) return [];
  const serial = op.payload.serial;
  const earlier = state.partSerials.get(partSerialOnWorkOrder(job.id, op.payload.partNumber, serial));
  if (!earlier) return [];
  const stepTitle = earlier.stepId === null ? null : (job.steps.get(earlier.stepId)?.title ?? null);
  return [repeatedSerialReason({ partNumber: op.payload.partNumber, serial }, job.number, stepTitle)];
}

/** The record an operation acts on, when it acts on one (a correction's reading, a timer's start, a withdrawal's entry). */
export function targetOf(op: Operation): Target | null {
  switch (op.kind) {
    case "measurement.recorded":
      return op.payload.supersedesId === undefined ? null : { kind: "reading", id: op.payload.supersedesId };
    case "timer.stopped":
    case "timer.overridden":
    case "timer.cancelled":
      return { kind: "timer", id: op.payload.timerId };
    case "entry.withdrawn":
      return { kind: "entry", id: op.payload.operationId };
    case "clock.off":
      return { kind: "clock", id: op.payload.clockId };
    default:
      return null;
  }
}

/** Whether the record `target` names is on file or was kept earlier in this merge. */
export function targetPresent(target: Target, state: MergeState): boolean {
  if (target.kind === "reading") return state.readings.has(target.id);
  if (target.kind === "clock") return state.clock.clocks.has(target.id);
  return target.kind === "timer" ? state.timers.has(target.id) : state.entries.has(target.id);
}

/** The ids of the records an accepted operation creates, which held operations may wait for (its entry, a timer it starts, a clock it opens). */
export function targetsCreated(op: Operation): string[] {
  if (op.kind === "timer.started") return [op.id, op.payload.timerId];
  if (op.kind === "clock.on") return [op.id, op.payload.clockId];
  return [op.id];
}

/** A record an operation names that has not arrived: the operation waits for it. */
type Missing = { reason: string; target: Target };

function waitFor(op: Operation, state: MergeState): Missing | null {
  const target = targetOf(op);
  if (!target || targetPresent(target, state)) return null;
  const what =
    target.kind === "reading"
      ? `the reading it corrects (${target.id})`
      : target.kind === "timer"
        ? `the start of timer ${target.id}`
        : target.kind === "clock"
          ? `the clock-on of clock ${target.id}`
          : `the entry it withdraws (${target.id})`;
  return { target, reason: `Held on the server until ${what} arrives; it is applied then, in stamp order.` };
}

/**
 * The refusal reason when the operation names something that is not on the job; the record it
 * waits for when it acts on one that has not arrived yet; else null.
 */
function checkReferences(op: Operation, job: WorkOrderFacts, state: MergeState): string | Missing | null {
  const onJob = `on work order #${job.number}`;
  const stepMissing = (stepId: string) => (job.steps.has(stepId) ? null : `Step ${stepId} is not part of a procedure ${onJob}.`);
  switch (op.kind) {
    case "step.completed":
      return stepMissing(op.payload.stepId);
    case "measurement.recorded": {
      const p = op.payload;
      const spec = job.measurementSpecs.get(p.specId);
      if (!spec || spec.stepId !== p.stepId)
        return stepMissing(p.stepId) ?? `Measurement spec ${p.specId} is not a spec of step ${p.stepId} ${onJob}.`;
      if (!sameMeasurementKind(p.unit, spec.unit)) {
        return `A reading in ${p.unit} cannot be recorded against "${spec.label}", which is measured in ${spec.unit}.`;
      }
      if (p.readingIndex >= spec.readingCount) {
        return `Reading index ${p.readingIndex} is out of range: "${spec.label}" takes ${spec.readingCount} reading${spec.readingCount === 1 ? "" : "s"} (index 0–${spec.readingCount - 1}).`;
      }
      if (p.supersedesId !== undefined) {
        const old = state.readings.get(p.supersedesId);
        if (!old) return waitFor(op, state);
        if (old.workOrderId !== job.id) return `Reading ${p.supersedesId} that this corrects is not on record ${onJob}.`;
        if (old.specId !== p.specId || old.readingIndex !== p.readingIndex) {
          return `Reading ${p.supersedesId} that this corrects is for another spec or reading index; a correction must be for the same reading.`;
        }
      }
      return null;
    }
    case "torque.bolt-confirmed": {
      const p = op.payload;
      const spec = job.torqueSpecs.get(p.torqueSpecId);
      if (!spec || spec.stepId !== p.stepId)
        return stepMissing(p.stepId) ?? `Torque spec ${p.torqueSpecId} is not a spec of step ${p.stepId} ${onJob}.`;
      if (p.passIndex > spec.passCount)
        return `Pass ${p.passIndex} is out of range: "${spec.label}" has ${spec.passCount} pass${spec.passCount === 1 ? "" : "es"}.`;
      if (p.bolt > spec.boltCount)
        return `Bolt ${p.bolt} is out of range: "${spec.label}" has ${spec.boltCount} bolt${spec.boltCount === 1 ? "" : "s"}.`;
      return null;
    }
    case "timer.started": {
      const p = op.payload;
      const missing = stepMissing(p.stepId);
      if (missing) return missing;
      if (p.timerSpecId !== undefined && job.timerSpecs.get(p.timerSpecId)?.stepId !== p.stepId) {
        return `Timer spec ${p.timerSpecId} is not a timer of step ${p.stepId} ${onJob}.`;
      }
      if (state.timers.has(p.timerId)) return `Timer ${p.timerId} is already on record.`;
      return null;
    }
    case "timer.stopped": {
      const timer = state.timers.get(op.payload.timerId);
      if (!timer) return waitFor(op, state);
      if (timer.workOrderId !== job.id) return `Timer ${op.payload.timerId} is not on record ${onJob}.`;
      if (Date.parse(op.payload.stoppedAt) < timer.startedAtMs) return `Timer ${op.payload.timerId} cannot stop before it started.`;
      return null;
    }
    case "timer.overridden":
    case "timer.cancelled": {
      const timer = state.timers.get(op.payload.timerId);
      if (!timer) return waitFor(op, state);
      if (timer.workOrderId !== job.id) return `Timer ${op.payload.timerId} is not on record ${onJob}.`;
      return null;
    }
    case "entry.withdrawn": {
      const entry = state.entries.get(op.payload.operationId);
      if (!entry) return waitFor(op, state);
      if (entry.workOrderId !== job.id) return `The entry ${op.payload.operationId} to withdraw is not on record ${onJob}.`;
      return null; // checkAuthority decides who may withdraw it
    }
    case "clock.on":
    case "clock.off": {
      const stages = (jobProcedureId: string, stageKey: string) =>
        [...job.steps.values()].some((s) => s.jobProcedureId === jobProcedureId && s.stageKey === stageKey);
      const problem = clockProblem(op, { id: job.id, number: job.number, stages }, state.clock);
      return problem === "missing" ? waitFor(op, state) : problem;
    }
    case "photo.queued": {
      const missing = stepMissing(op.payload.stepId);
      if (missing) return missing;
      if (state.attachmentIds.has(op.payload.attachmentId)) return `Photo ${op.payload.attachmentId} is already on record.`;
      return null;
    }
    case "part.fitted": {
      const missing = stepMissing(op.payload.stepId);
      if (missing) return missing;
      if (state.partIds.has(op.payload.partFittedId)) return `Part record ${op.payload.partFittedId} is already on record.`;
      return null;
    }
    case "stage.signed-off": {
      const { jobProcedureId, stageKey } = op.payload;
      const steps = [...job.steps.values()];
      if (!steps.some((s) => s.jobProcedureId === jobProcedureId)) return `Procedure ${jobProcedureId} is not ${onJob}.`;
      if (!steps.some((s) => s.jobProcedureId === jobProcedureId && s.stageKey === stageKey)) {
        return `Stage "${stageKey}" is not a stage of procedure ${jobProcedureId} ${onJob}.`;
      }
      return null;
    }
  }
}

/** Adds what an accepted operation created to the state, so later operations in the batch can name it. */
export function noteAccepted(op: Operation, state: MergeState, jobNumber = 0): void {
  const entry: EntryFacts = { workOrderId: op.workOrderId, kind: op.kind, authorId: op.authorId, withdrawn: false };
  const stepId = (op.payload as { stepId?: unknown }).stepId;
  if (typeof stepId === "string") entry.stepId = stepId;
  if (!state.entries.has(op.id)) state.entries.set(op.id, entry);
  switch (op.kind) {
    case "measurement.recorded":
      state.readings.set(op.id, { workOrderId: op.workOrderId, specId: op.payload.specId, readingIndex: op.payload.readingIndex });
      return;
    case "torque.bolt-confirmed": {
      const key = boltKey(op.workOrderId, op.payload.torqueSpecId, op.payload.passIndex, op.payload.bolt);
      entry.boltKey = key;
      state.bolts.set(key, [...(state.bolts.get(key) ?? []), { id: op.id, deviceId: op.deviceId, deviceTime: op.deviceTime }]);
      return;
    }
    case "stage.signed-off":
      entry.decided = false;
      return;
    case "entry.withdrawn": {
      const target = state.entries.get(op.payload.operationId);
      if (!target || target.withdrawn) return; // the first withdrawal stands
      target.withdrawn = true;
      if (target.boltKey) {
        const left = (state.bolts.get(target.boltKey) ?? []).filter((b) => b.id !== op.payload.operationId);
        state.bolts.set(target.boltKey, left);
      }
      // a withdrawn part no longer makes a later one with its serial number a repeat
      if (target.serialKey && state.partSerials.get(target.serialKey)?.operationId === op.payload.operationId) {
        state.partSerials.delete(target.serialKey);
      }
      return;
    }
    case "timer.started":
      state.timers.set(op.payload.timerId, {
        id: op.payload.timerId,
        workOrderId: op.workOrderId,
        timerSpecId: op.payload.timerSpecId ?? null,
        startedBy: op.authorId,
        startedAtMs: Date.parse(op.payload.startedAt),
        durationS: op.payload.durationS,
        stoppedAtMs: null,
        cancelled: false,
        overrideAtMs: null,
      });
      return;
    case "timer.stopped": {
      const t = state.timers.get(op.payload.timerId);
      const at = Date.parse(op.payload.stoppedAt);
      if (t) t.stoppedAtMs = t.stoppedAtMs === null ? at : Math.min(t.stoppedAtMs, at);
      return;
    }
    case "timer.cancelled": {
      const t = state.timers.get(op.payload.timerId);
      if (t) t.cancelled = true;
      return;
    }
    case "timer.overridden": {
      // the first override stands; it releases the hold from the time it was made
      const t = state.timers.get(op.payload.timerId);
      if (t && t.overrideAtMs === null) t.overrideAtMs = Date.parse(op.deviceTime);
      return;
    }
    case "photo.queued":
      state.attachmentIds.add(op.payload.attachmentId);
      return;
    case "clock.on":
    case "clock.off":
      noteClock(op, jobNumber, state.clock);
      return;
    case "part.fitted": {
      const p = op.payload;
      state.partIds.add(p.partFittedId);
      const key = p.serial === undefined ? null : partSerialOnWorkOrder(op.workOrderId, p.partNumber, p.serial);
      if (key !== null) entry.serialKey = key;
      if (key !== null && !state.partSerials.has(key)) state.partSerials.set(key, { stepId: p.stepId, operationId: op.id });
      return;
    }
    default:
      return;
  }
}
