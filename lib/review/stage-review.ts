/**
 * What a supervisor sees when reviewing one sign-off: every step of the signed-off stage with who
 * did what and when, every reading (superseded ones too) against its spec, readings of one spot
 * from two tablets side by side, torque bolt by bolt, timers, photos, parts fitted, and the readings out of
 * tolerance with any written acceptance. Pure: built from the bench snapshot plus a few extras.
 */
import type { MeasurementUnit } from "@/lib/calc/units";
import type { Verdict } from "@/lib/sync/readings";
import { expectedReadings } from "../procedures/spec-counts";
import { torqueStages } from "@/lib/calc/torque-stages";
import { compareStamps } from "@/lib/sync/hlc";
import { currentReadings } from "@/lib/sync/readings";
import { decimalOfNumber } from "@/lib/sync/reading-value";
import type { JobSnapshot } from "@/lib/sync/snapshot";

type State = JobSnapshot["state"];
type Step = JobSnapshot["procedures"][number]["stages"][number]["steps"][number];

interface Receipt {
  receivedAt: string;
  deviceId: string;
}

interface AcceptanceFact {
  measurementId: string;
  decisionId: string;
  justification: string;
  acceptedBy: string;
  acceptedAt: string;
}

export interface DecisionFact {
  id: string;
  signOffId: string;
  decision: "approved" | "sent_back";
  reason: string;
  reopenedStepIds: string[];
  decidedBy: string;
  decidedAt: string;
  seq: string;
}

interface SignOffFact {
  id: string;
  jobProcedureId: string;
  stageKey: string;
  signedBy: string;
  deviceTime: string;
  receivedAt: string;
  deviceId: string;
  seq: string;
  flagged: boolean;
  flagReason: string | null;
}

export interface ReviewExtras {
  /** Operation id → when the server received it and from which device. */
  receipts: ReadonlyMap<string, Receipt>;
  /** User id → name (everyone of the shop). */
  names: ReadonlyMap<string, string>;
  acceptances: readonly AcceptanceFact[];
  /** Every sign-off on the job (with the device and any flag of its operation). */
  signOffs: readonly SignOffFact[];
  /** Every decision on the job, old ones too. */
  decisions: readonly DecisionFact[];
}

export interface Person {
  id: string;
  name: string;
}

/** Who withdrew an entry, when and why (the entry stays on the record, marked). */
export interface WithdrawnLine {
  by: Person;
  at: string;
  reason: string;
}

export interface ReadingLine {
  id: string;
  /** Exactly as typed and stored ("0.030"). */
  value: string;
  unit: MeasurementUnit;
  verdict: Verdict;
  note: string;
  by: Person;
  deviceId: string;
  deviceTime: string;
  receivedAt: string | null;
  stamp: string;
  current: boolean;
  /** Replaced by a correction (the id of the reading that replaced it). */
  supersededBy: string | null;
  flagReason: string | null;
  acceptance: (Omit<AcceptanceFact, "measurementId" | "acceptedBy"> & { by: Person }) | null;
}

interface SpotView {
  readingIndex: number;
  label: string;
  current: ReadingLine | null;
  /** Every reading of the spot, oldest stamp first. */
  history: ReadingLine[];
  /** Latest readings from different tablets that no correction replaced: shown side by side. */
  rivals: ReadingLine[];
}

export interface SpecView {
  id: string;
  label: string;
  unit: MeasurementUnit;
  nominal: number | null;
  min: number;
  max: number;
  spots: SpotView[];
}

/** One bolt record of one pass, as the supervisor reads it. */
export interface BoltLine {
  id: string;
  by: Person;
  deviceTime: string;
  receivedAt: string | null;
  deviceId: string | null;
  wrench: string | null;
  flagReason: string | null;
  withdrawn: WithdrawnLine | null;
}

export interface TorqueView {
  id: string;
  label: string;
  finalValue: number;
  unit: string;
  pattern: string;
  boltCount: number;
  torqueToYield: boolean;
  passes: Array<{
    index: number;
    label: string;
    bolts: Array<{
      bolt: number;
      /** The record that counts (the first one not withdrawn), or null when the bolt is still to do. */
      done: BoltLine | null;
      /** Every record of this bolt and pass, withdrawn ones too, oldest first. */
      records: BoltLine[];
    }>;
  }>;
  /** Bolts of a pass recorded more than once (withdrawn records left out): two tablets on one bolt, or one tablet twice. */
  repeated: Array<{ passIndex: number; bolt: number; records: BoltLine[] }>;
  complete: boolean;
}

export interface StepReview {
  id: string;
  key: string;
  title: string;
  number: number;
  completions: Array<{
    id: string;
    by: Person;
    deviceTime: string;
    receivedAt: string;
    deviceId: string | null;
    flagReason: string | null;
    withdrawn: WithdrawnLine | null;
  }>;
  specs: SpecView[];
  torque: TorqueView[];
  timers: Array<{
    id: string;
    label: string;
    durationS: number;
    startedAt: string;
    startedBy: Person;
    stoppedAt: string | null;
    stop: { by: Person | null; reason: string | null } | null;
    cancelled: { at: string; by: Person | null; reason: string } | null;
    override: { by: Person; reason: string } | null;
  }>;
  photos: Array<{
    id: string;
    contentType: string;
    byteSize: number;
    caption: string;
    awaitingUpload: boolean;
    createdAt: string;
    withdrawn: WithdrawnLine | null;
  }>;
  /** Parts fitted at this step, with who fitted them (null: not a user of the shop), any flag of the sync and any withdrawal. */
  parts: Array<
    Omit<State["parts"][number], "stepId" | "fittedBy" | "flagged" | "operationId"> & { by: Person | null; withdrawn: WithdrawnLine | null }
  >;
  /** A send-back that reopened this step, latest first. */
  sentBack: Array<{ reason: string; decidedAt: string; by: Person }>;
}

export interface OutOfTolerance {
  readingId: string;
  stepId: string;
  stepTitle: string;
  specLabel: string;
  readingLabel: string;
  value: string;
  unit: string;
  verdict: "low" | "high";
  min: number;
  max: number;
  note: string;
  acceptance: ReadingLine["acceptance"];
}

export interface StageReview {
  signOff: Omit<SignOffFact, "signedBy"> & { by: Person; isLatest: boolean; withdrawn: WithdrawnLine | null };
  /** Torque-to-yield bolts recorded twice in this stage: shown first, loud. */
  stretchBoltsTwice: Array<{ stepTitle: string; specLabel: string; passIndex: number; bolt: number; records: BoltLine[] }>;
  /** Entries of this stage withdrawn (they stay on the record, marked). */
  withdrawnCount: number;
  stage: { jobProcedureId: string; key: string; title: string; procedureName: string };
  steps: StepReview[];
  outOfTolerance: OutOfTolerance[];
  /** Steps a send-back reopens unless the supervisor picks others: those with readings out of tolerance, else all. */
  defaultReopenStepIds: string[];
  /** Decisions on this sign-off, oldest first (the last one stands). */
  decisions: Array<Omit<DecisionFact, "decidedBy"> & { by: Person }>;
  /** Earlier sign-offs of the same stage and what became of them, newest first. */
  earlier: Array<{
    id: string;
    by: Person;
    deviceTime: string;
    receivedAt: string;
    decisions: Array<{ decision: "approved" | "sent_back"; reason: string; decidedAt: string; by: Person }>;
  }>;
}

export function readingLabelOf(labels: readonly string[], index: number): string {
  return labels[index] ?? (labels.length > 1 ? `Reading ${index + 1}` : "Reading");
}

/** Builds the review of sign-off `signOffId`; null when the snapshot has no such sign-off. */
export function buildStageReview(snapshot: JobSnapshot, extras: ReviewExtras, signOffId: string): StageReview | null {
  const signOff = extras.signOffs.find((s) => s.id === signOffId);
  if (!signOff) return null;
  const procedure = snapshot.procedures.find((p) => p.jobProcedureId === signOff.jobProcedureId);
  const stage = procedure?.stages.find((s) => s.key === signOff.stageKey);
  if (!procedure || !stage) return null;

  const person = (id: string): Person => ({ id, name: extras.names.get(id) ?? "(unknown user)" });
  const state: State = snapshot.state;
  const withdrawals = new Map<string, WithdrawnLine>();
  for (const w of state.withdrawals ?? []) {
    if (!withdrawals.has(w.operationId)) withdrawals.set(w.operationId, { by: person(w.withdrawnBy), at: w.deviceTime, reason: w.reason });
  }
  const withdrawnOf = (operationId: string | null | undefined) => (operationId ? (withdrawals.get(operationId) ?? null) : null);
  const acceptanceOf = new Map(extras.acceptances.map((a) => [a.measurementId, a]));
  const supersededBy = new Map<string, string>();
  for (const r of state.readings) if (r.supersedesId) supersededBy.set(r.supersedesId, r.id);
  const currentIds = new Set(currentReadings(state.readings).map((r) => r.id));

  const line = (r: State["readings"][number]): ReadingLine => {
    const a = acceptanceOf.get(r.id);
    return {
      id: r.id,
      value: r.valueText ?? decimalOfNumber(r.value) ?? String(r.value),
      unit: r.unit,
      verdict: r.verdict,
      note: r.note,
      by: person(r.recordedBy),
      deviceId: r.deviceId,
      deviceTime: r.deviceTime,
      receivedAt: extras.receipts.get(r.id)?.receivedAt ?? null,
      stamp: r.stamp,
      current: currentIds.has(r.id),
      supersededBy: supersededBy.get(r.id) ?? null,
      flagReason: r.flagged ? r.flagReason : null,
      acceptance: a
        ? { decisionId: a.decisionId, justification: a.justification, acceptedAt: a.acceptedAt, by: person(a.acceptedBy) }
        : null,
    };
  };

  const stepNumbers = new Map<string, number>();
  let n = 0;
  for (const p of snapshot.procedures) for (const s of p.stages) for (const st of s.steps) stepNumbers.set(st.id, ++n);

  const sendBacks = extras.decisions.filter((d) => d.decision === "sent_back");
  const steps = stage.steps.map((step) =>
    stepReview(step, stepNumbers.get(step.id) ?? 0, state, extras, line, person, sendBacks, withdrawnOf),
  );

  const outOfTolerance: OutOfTolerance[] = [];
  for (const s of steps) {
    for (const spec of s.specs) {
      for (const spot of spec.spots) {
        const c = spot.current;
        if (!c || c.verdict === "in") continue;
        outOfTolerance.push({
          readingId: c.id,
          stepId: s.id,
          stepTitle: s.title,
          specLabel: spec.label,
          readingLabel: spot.label,
          value: c.value,
          unit: c.unit,
          verdict: c.verdict,
          min: spec.min,
          max: spec.max,
          note: c.note,
          acceptance: c.acceptance,
        });
      }
    }
  }
  const unaccepted = outOfTolerance.filter((o) => !o.acceptance);
  const defaultReopenStepIds = unaccepted.length ? [...new Set(unaccepted.map((o) => o.stepId))] : steps.map((s) => s.id);

  const sameStage = extras.signOffs
    .filter((s) => s.jobProcedureId === signOff.jobProcedureId && s.stageKey === signOff.stageKey)
    .sort((a, b) => Number(BigInt(b.seq) - BigInt(a.seq)));
  const decisionsOf = (id: string) =>
    extras.decisions.filter((d) => d.signOffId === id).sort((a, b) => Number(BigInt(a.seq) - BigInt(b.seq)));

  const stretchBoltsTwice = steps.flatMap((s) =>
    s.torque.filter((t) => t.torqueToYield).flatMap((t) => t.repeated.map((r) => ({ stepTitle: s.title, specLabel: t.label, ...r }))),
  );
  const withdrawnCount =
    steps.reduce(
      (n, s) =>
        n +
        s.completions.filter((c) => c.withdrawn).length +
        s.photos.filter((p) => p.withdrawn).length +
        s.parts.filter((p) => p.withdrawn).length +
        s.torque.reduce(
          (m, t) => m + t.passes.reduce((k, p) => k + p.bolts.reduce((j, b) => j + b.records.filter((r) => r.withdrawn).length, 0), 0),
          0,
        ),
      0,
    ) + sameStage.filter((x) => withdrawals.has(x.id)).length;

  const { signedBy, ...signOffRest } = signOff;
  return {
    signOff: { ...signOffRest, by: person(signedBy), isLatest: sameStage[0]?.id === signOff.id, withdrawn: withdrawnOf(signOff.id) },
    stretchBoltsTwice,
    withdrawnCount,
    stage: { jobProcedureId: procedure.jobProcedureId, key: stage.key, title: stage.title, procedureName: procedure.name },
    steps,
    outOfTolerance,
    defaultReopenStepIds,
    decisions: decisionsOf(signOff.id).map(({ decidedBy, ...d }) => ({ ...d, by: person(decidedBy) })),
    earlier: sameStage
      .filter((s) => BigInt(s.seq) < BigInt(signOff.seq))
      .map((s) => ({
        id: s.id,
        by: person(s.signedBy),
        deviceTime: s.deviceTime,
        receivedAt: s.receivedAt,
        decisions: decisionsOf(s.id).map((d) => ({
          decision: d.decision,
          reason: d.reason,
          decidedAt: d.decidedAt,
          by: person(d.decidedBy),
        })),
      })),
  };
}

function stepReview(
  step: Step,
  number: number,
  state: State,
  extras: ReviewExtras,
  line: (r: State["readings"][number]) => ReadingLine,
  person: (id: string) => Person,
  sendBacks: readonly DecisionFact[],
  withdrawnOf: (operationId: string | null | undefined) => WithdrawnLine | null,
): StepReview {
  const specs: SpecView[] = step.measurementSpecs.map((spec) => {
    const count = expectedReadings(spec.readingLabels);
    const ofSpec = state.readings.filter((r) => r.specId === spec.id);
    const indexes = new Set<number>([...Array.from({ length: count }, (_, i) => i), ...ofSpec.map((r) => r.readingIndex)]);
    const spots = [...indexes]
      .sort((a, b) => a - b)
      .map((readingIndex): SpotView => {
        const history = ofSpec
          .filter((r) => r.readingIndex === readingIndex)
          .sort((a, b) => compareStamps(a.stamp, b.stamp))
          .map(line);
        const heads = history.filter((r) => !r.supersededBy);
        // The newest unreplaced reading of each tablet; two or more tablets means a conflict.
        const perDevice = new Map<string, ReadingLine>();
        for (const r of heads) perDevice.set(r.deviceId, r);
        const rivals = perDevice.size > 1 ? [...perDevice.values()] : [];
        return {
          readingIndex,
          label: readingLabelOf(spec.readingLabels, readingIndex),
          current: history.find((r) => r.current) ?? null,
          history,
          rivals,
        };
      });
    return { id: spec.id, label: spec.label, unit: spec.unit, nominal: spec.nominal, min: spec.min, max: spec.max, spots };
  });

  const torque: TorqueView[] = step.torqueSpecs.map((spec) => {
    const recorded = new Map<string, BoltLine[]>();
    for (const t of state.torqueRecords) {
      if (t.torqueSpecId !== spec.id) continue;
      const key = `${t.passIndex}:${t.bolt}`;
      recorded.set(key, [
        ...(recorded.get(key) ?? []),
        {
          id: t.id,
          by: person(t.recordedBy),
          deviceTime: t.deviceTime,
          receivedAt: extras.receipts.get(t.id)?.receivedAt ?? null,
          deviceId: extras.receipts.get(t.id)?.deviceId ?? null,
          wrench: t.wrenchReading === null ? null : `${t.wrenchReadingText ?? t.wrenchReading} ${t.wrenchUnit ?? ""}`.trim(),
          flagReason: t.flagged ? (t.flagReason ?? null) : null,
          withdrawn: withdrawnOf(t.id),
        },
      ]);
    }
    const repeated: TorqueView["repeated"] = [];
    const passes = torqueStages({ finalValue: spec.finalValue, unit: spec.unit, passes: spec.passes, anglePasses: spec.anglePasses }).map(
      (p) => ({
        index: p.index,
        label: p.kind === "torque" ? `${p.target} ${p.unit} (${p.label})` : `turn ${p.label}`,
        bolts: Array.from({ length: spec.boltCount }, (_, i) => {
          const records = recorded.get(`${p.index}:${i + 1}`) ?? [];
          const counting = records.filter((r) => !r.withdrawn);
          if (counting.length > 1) repeated.push({ passIndex: p.index, bolt: i + 1, records: counting });
          return { bolt: i + 1, done: counting[0] ?? null, records };
        }),
      }),
    );
    return {
      id: spec.id,
      label: spec.label,
      finalValue: spec.finalValue,
      unit: spec.unit,
      pattern: spec.pattern,
      boltCount: spec.boltCount,
      torqueToYield: spec.torqueToYield,
      passes,
      repeated,
      complete: passes.every((p) => p.bolts.every((b) => b.done)),
    };
  });

  return {
    id: step.id,
    key: step.key,
    title: step.title,
    number,
    completions: state.completions
      .filter((c) => c.stepId === step.id)
      .map((c) => ({
        id: c.id,
        by: person(c.completedBy),
        deviceTime: c.deviceTime,
        receivedAt: c.receivedAt,
        deviceId: extras.receipts.get(c.id)?.deviceId ?? null,
        flagReason: c.flagged ? c.flagReason : null,
        withdrawn: withdrawnOf(c.id),
      })),
    specs,
    torque,
    timers: state.timers
      .filter((t) => t.stepId === step.id)
      .map((t) => ({
        id: t.id,
        label: t.label,
        durationS: t.durationS,
        startedAt: t.startedAt,
        startedBy: person(t.startedBy),
        stoppedAt: t.stoppedAt,
        stop: t.stoppedAt ? { by: t.stoppedBy ? person(t.stoppedBy) : null, reason: t.stopReason ?? null } : null,
        cancelled:
          t.cancelledAt && t.cancelReason
            ? { at: t.cancelledAt, by: t.cancelledBy ? person(t.cancelledBy) : null, reason: t.cancelReason }
            : null,
        override: t.overrideReason ? { by: person(t.overrideBy ?? t.startedBy), reason: t.overrideReason } : null,
      })),
    photos: state.photos
      .filter((p) => p.stepId === step.id)
      .map(({ stepId: _s, operationId, uploadedBy: _u, ...p }) => ({ ...p, withdrawn: withdrawnOf(operationId) })),
    parts: state.parts
      .filter((p) => p.stepId === step.id)
      .map(({ stepId: _s, fittedBy, flagged: _f, operationId, ...p }) => ({
        ...p,
        by: fittedBy ? person(fittedBy) : null,
        withdrawn: withdrawnOf(operationId),
      })),
    sentBack: sendBacks
      .filter((d) => d.reopenedStepIds.includes(step.id))
      .sort((a, b) => Number(BigInt(b.seq) - BigInt(a.seq)))
      .map((d) => ({ reason: d.reason, decidedAt: d.decidedAt, by: person(d.decidedBy) })),
  };
}
