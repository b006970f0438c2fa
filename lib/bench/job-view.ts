/**
 * What the bench shows for one job: the server's snapshot with this tablet's own waiting
 * operations laid on top, turned into per-step and per-stage state. Pure (no React, no IndexedDB),
 * so the same rules hold online and offline and are unit-tested.
 */
import { torqueStages, type TorquePass } from "@/lib/calc/torque-stages";
import { tighteningSequence } from "@/lib/calc/tightening-sequence";
import { compareStamps } from "@/lib/sync/hlc";
import type { Operation } from "@/lib/sync/operations";
import { currentReadings, readingVerdict } from "@/lib/sync/readings";
import { serialKey } from "@/lib/sync/parts";
import type { JobSnapshot } from "@/lib/sync/snapshot";

type Snap = JobSnapshot;
type Procedure = Snap["procedures"][number];
type Stage = Procedure["stages"][number];
export type BenchStep = Stage["steps"][number];
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
export type PartView = Omit<Snap["state"]["parts"][number], "stepId" | "flagged"> & { pending: boolean };

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
  blockedBy: {
    label: string;
    remainingMs: number;
    started: boolean;
    timerId: string | null;
    timerSpecId: string;
    stepId: string;
    durationS: number;
  } | null;
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
  signedOff: { at: string; pending: boolean } | null;
  decision: { decision: "approved" | "sent_back"; reason: string } | null;
  canSignOff: boolean;
}

export interface JobView {
  stages: StageView[];
  steps: StepView[];
  doneCount: number;
  totalCount: number;
  outOfTolerance: number;
}

/** Readings per spec a step expects: its reading labels, or one. */
export function readingCount(spec: MeasurementSpecView): number {
  return Math.max(1, spec.readingLabels.length);
}

export function buildJobView(snapshot: Snap, pending: readonly Operation[], nowMs: number): JobView {
  const own = pending.filter((o) => o.workOrderId === snapshot.workOrder.id);
  const ofKind = <K extends Operation["kind"]>(k: K) => own.filter((o): o is Extract<Operation, { kind: K }> => o.kind === k);

  // Readings: server ones plus waiting ones.
  const readings: ReadingView[] = [
    ...snapshot.state.readings.map((r) => ({ ...r, pending: false })),
    ...ofKind("measurement.recorded").map((o) => {
      const spec = findSpec(snapshot, o.payload.specId);
      return {
        id: o.id,
        specId: o.payload.specId,
        readingIndex: o.payload.readingIndex,
        value: o.payload.value,
        unit: o.payload.unit,
        verdict: spec ? readingVerdict(o.payload.value, o.payload.unit, spec) : ("in" as const),
        note: o.payload.note ?? "",
        supersedesId: o.payload.supersedesId ?? null,
        stamp: o.stamp,
        recordedBy: o.authorId,
        deviceId: o.deviceId,
        pending: true,
      };
    }),
  ];
  const currentAll = currentReadings(readings);

  const torqueDone = new Set<string>([
    ...snapshot.state.torqueRecords.map((t) => `${t.torqueSpecId}|${t.passIndex}:${t.bolt}`),
    ...ofKind("torque.bolt-confirmed").map((o) => `${o.payload.torqueSpecId}|${o.payload.passIndex}:${o.payload.bolt}`),
  ]);

  const stopped = new Map<string, number>();
  for (const o of ofKind("timer.stopped")) stopped.set(o.payload.timerId, Date.parse(o.payload.stoppedAt));
  const overridden = new Map<string, string>();
  for (const o of ofKind("timer.overridden")) if (!overridden.has(o.payload.timerId)) overridden.set(o.payload.timerId, o.payload.reason);
  const timers: TimerView[] = [
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
    ...ofKind("timer.started").map((o) =>
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

  const photosByStep = new Map<string, number>();
  for (const p of snapshot.state.photos) if (p.stepId) photosByStep.set(p.stepId, (photosByStep.get(p.stepId) ?? 0) + 1);
  for (const o of ofKind("photo.queued")) photosByStep.set(o.payload.stepId, (photosByStep.get(o.payload.stepId) ?? 0) + 1);

  const partsByStep = new Map<string, PartView[]>();
  const parts: Array<PartView & { stepId: string | null }> = [
    // A snapshot stored before parts were part of it has none.
    ...(snapshot.state.parts ?? []).map(({ flagged: _flagged, ...p }) => ({ ...p, pending: false })),
    ...ofKind("part.fitted").map((o) => ({
      id: o.payload.partFittedId,
      stepId: o.payload.stepId,
      partNumber: o.payload.partNumber,
      description: o.payload.description,
      supplier: o.payload.supplier ?? "",
      serial: o.payload.serial ?? null,
      batch: o.payload.batch ?? null,
      quantity: o.payload.quantity,
      fittedBy: o.authorId,
      fittedAt: o.deviceTime,
      flagReason: null,
      pending: true,
    })),
  ];
  for (const { stepId, ...p } of parts) if (stepId) partsByStep.set(stepId, [...(partsByStep.get(stepId) ?? []), p]);

  // Latest decision per stage (by seq) and the steps it reopened.
  const latestDecision = new Map<string, Snap["state"]["reviewDecisions"][number]>();
  for (const d of snapshot.state.reviewDecisions) {
    const key = `${d.jobProcedureId}|${d.stageKey}`;
    const held = latestDecision.get(key);
    if (!held || BigInt(d.seq) > BigInt(held.seq)) latestDecision.set(key, d);
  }

  const stepKeyToId = new Map<string, string>();
  for (const p of snapshot.procedures)
    for (const s of p.stages) for (const st of s.steps) stepKeyToId.set(`${p.jobProcedureId}|${st.key}`, st.id);

  const steps: StepView[] = [];
  const stages: StageView[] = [];
  let outOfTolerance = 0;
  for (const proc of snapshot.procedures) {
    for (const stage of proc.stages) {
      const decision = latestDecision.get(`${proc.jobProcedureId}|${stage.key}`) ?? null;
      const stageSteps: StepView[] = [];
      for (const step of stage.steps) {
        const serverCompletions = snapshot.state.completions.filter((c) => c.stepId === step.id);
        const pendingCompletion = ofKind("step.completed").some((o) => o.payload.stepId === step.id);
        const reopenedBy = snapshot.state.reviewDecisions
          .filter((d) => d.decision === "sent_back" && d.reopenedStepIds.includes(step.id))
          .sort((a, b) => (BigInt(a.seq) < BigInt(b.seq) ? 1 : -1))[0];
        const completedAfterReopen = reopenedBy
          ? pendingCompletion || serverCompletions.some((c) => BigInt(c.seq) > BigInt(reopenedBy.seq))
          : false;
        const everDone = pendingCompletion || serverCompletions.length > 0;
        const done = reopenedBy ? completedAfterReopen : everDone;
        const flagged = serverCompletions.find((c) => c.flagged)?.flagReason ?? null;

        const stepReadings = new Map<string, ReadingView[]>();
        const current = new Map<string, Map<number, ReadingView>>();
        const missing: string[] = [];
        for (const spec of step.measurementSpecs) {
          stepReadings.set(
            spec.id,
            readings.filter((r) => r.specId === spec.id).sort((a, b) => compareStamps(a.stamp, b.stamp)),
          );
          const perIndex = new Map<number, ReadingView>();
          for (const r of currentAll) if (r.specId === spec.id) perIndex.set(r.readingIndex, r);
          current.set(spec.id, perIndex);
          const count = readingCount(spec);
          const have = [...perIndex.keys()].filter((i) => i < count).length;
          if (have < count) missing.push(`${spec.label}: ${count - have} of ${count} reading${count > 1 ? "s" : ""} to record`);
          outOfTolerance += [...perIndex.values()].filter((r) => r.verdict !== "in").length;
        }

        const torque = step.torqueSpecs.map((spec) => torqueProgress(spec, torqueDone));
        for (const t of torque) if (!t.complete) missing.push(`${t.spec.label}: torque sequence not finished`);

        const stepTimers = timers.filter((t) => t.stepId === step.id);
        for (const spec of step.timerSpecs) {
          if (!stepTimers.some((t) => t.timerSpecId === spec.id)) missing.push(`Start the timer: ${spec.label}`);
        }
        const photoCount = photosByStep.get(step.id) ?? 0;
        if (step.requiresPhoto && photoCount === 0) missing.push("Take at least one photo");

        stageSteps.push({
          step,
          stageKey: stage.key,
          jobProcedureId: proc.jobProcedureId,
          index: steps.length + stageSteps.length,
          done,
          donePending: pendingCompletion,
          reopened: reopenedBy && !completedAfterReopen ? { reason: reopenedBy.reason, decidedAt: reopenedBy.decidedAt } : null,
          flagged,
          readings: stepReadings,
          current,
          torque,
          timers: stepTimers,
          blockedBy: null,
          photoCount,
          parts: partsByStep.get(step.id) ?? [],
          missing,
        });
      }
      // Timers that block a later step until they have run out.
      for (const sv of stageSteps) {
        for (const spec of sv.step.timerSpecs) {
          if (!spec.blocksStepKey) continue;
          const blockedId = stepKeyToId.get(`${proc.jobProcedureId}|${spec.blocksStepKey}`);
          const target = stageSteps.find((s) => s.step.id === blockedId) ?? null;
          if (!target) continue;
          const t = sv.timers.filter((x) => x.timerSpecId === spec.id).sort((a, b) => b.startedAtMs - a.startedAtMs)[0];
          const on = { timerSpecId: spec.id, stepId: sv.step.id, durationS: spec.durationS };
          if (!t) target.blockedBy = { label: spec.label, remainingMs: spec.durationS * 1000, started: false, timerId: null, ...on };
          else if (!t.done) target.blockedBy = { label: t.label, remainingMs: t.remainingMs, started: true, timerId: t.id, ...on };
        }
      }
      const latestSignOff = [...snapshot.state.signOffs]
        .filter((s) => s.jobProcedureId === proc.jobProcedureId && s.stageKey === stage.key)
        .sort((a, b) => (BigInt(a.seq) < BigInt(b.seq) ? 1 : -1))[0];
      const pendingSignOff = ofKind("stage.signed-off").find(
        (o) => o.payload.jobProcedureId === proc.jobProcedureId && o.payload.stageKey === stage.key,
      );
      const allDone = stageSteps.every((s) => s.done);
      // A send-back needs a new sign-off once its steps are redone.
      const signOffStillStands =
        latestSignOff && (!decision || decision.decision === "approved" || BigInt(latestSignOff.seq) > BigInt(decision.seq));
      const signedOff = pendingSignOff
        ? { at: pendingSignOff.deviceTime, pending: true }
        : signOffStillStands
          ? { at: latestSignOff.deviceTime, pending: false }
          : null;
      stages.push({
        jobProcedureId: proc.jobProcedureId,
        procedureName: proc.name,
        key: stage.key,
        title: stage.title,
        steps: stageSteps,
        allDone,
        signedOff,
        decision: decision ? { decision: decision.decision, reason: decision.reason } : null,
        canSignOff: allDone && !signedOff,
      });
      steps.push(...stageSteps);
    }
  }
  return { stages, steps, doneCount: steps.filter((s) => s.done).length, totalCount: steps.length, outOfTolerance };
}

/** The step of this job where a part with this part number and serial number is already recorded, if any. */
export function stepWithSerial(view: JobView, partNumber: string, serial: string): StepView | null {
  const key = serialKey(partNumber, serial);
  return view.steps.find((s) => s.parts.some((p) => p.serial !== null && serialKey(p.partNumber, p.serial) === key)) ?? null;
}

function findSpec(snapshot: Snap, specId: string): MeasurementSpecView | undefined {
  for (const p of snapshot.procedures)
    for (const s of p.stages) for (const st of s.steps) for (const m of st.measurementSpecs) if (m.id === specId) return m;
  return undefined;
}

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

/** Passes, tightening order and the next bolt for one torque spec. */
export function torqueProgress(spec: TorqueSpecView, confirmedKeys: ReadonlySet<string>): TorqueProgress {
  const passes = torqueStages({ finalValue: spec.finalValue, unit: spec.unit, passes: spec.passes, anglePasses: spec.anglePasses });
  const sequence = tighteningSequence(spec.pattern, spec.boltCount);
  const confirmed = new Set<string>();
  for (const p of passes) for (const b of sequence) if (confirmedKeys.has(`${spec.id}|${p.index}:${b}`)) confirmed.add(`${p.index}:${b}`);
  let next: TorqueProgress["next"] = null;
  outer: for (const p of passes) {
    for (const [i, b] of sequence.entries()) {
      if (!confirmed.has(`${p.index}:${b}`)) {
        next = { passIndex: p.index, bolt: b, positionInPass: i };
        break outer;
      }
    }
  }
  return { spec, passes, sequence, confirmed, next, complete: next === null };
}
