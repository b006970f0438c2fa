/**
 * Flagged bench work: any operation the sync kept and flagged for a person to look at
 * (`operations.flagged` / `flag_reason`), whatever its kind — late work on a closed job, a
 * completion made before the tablet knew of a send-back, a clock far ahead, a serial recorded
 * twice, and kinds added later. It belongs to the stage of the step it names, found the same way
 * for every kind:
 *   1. a sign-off names its stage (`jobProcedureId`, `stageKey`);
 *   2. an entry that names a step (`stepId`) belongs to that step;
 *   3. an entry that names a timer (`timerId`) belongs to the timer's step;
 *   4. an entry that names another entry of the job (any id in its payload: a correction, a
 *      withdrawal, a stop) belongs where that entry belongs (followed a few links deep).
 * An entry none of these place is "on no stage"; it is shown on every stage review of the job
 * and can be accepted there. Pure.
 */

export interface StageRef {
  jobProcedureId: string;
  stageKey: string;
}

/** The place found for an entry is this stage. */
export const isStage = (place: StageRef | null | undefined, stage: StageRef): boolean =>
  place?.jobProcedureId === stage.jobProcedureId && place.stageKey === stage.stageKey;

/** One flagged entry as the database holds it. */
export interface FlaggedEntry {
  operationId: string;
  kind: string;
  payload: unknown;
  flagReason: string;
  /** Its place in the change sequence (operations.seq), as text. */
  seq: string;
  authorId: string;
  deviceTime: string;
  receivedAt: string;
  /** The supervisor's written acceptance, once made. */
  acceptance: { decisionId: string | null; justification: string; acceptedBy: string; acceptedAt: string } | null;
}

/** What finding an entry's stage may look up. */
export interface PlaceLookup {
  /** Step id → its stage on this job. */
  stageOfStep: ReadonlyMap<string, StageRef>;
  /** Timer id → the step it was started on. */
  stepOfTimer: ReadonlyMap<string, string>;
  /** Other operations of the job that flagged entries name (id → kind and payload). */
  operations: ReadonlyMap<string, { kind: string; payload: unknown }>;
}

const MAX_LINKS = 4;

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Every id-like string in a payload (top level and one level of nested objects), for following links. */
export function idsNamedIn(payload: unknown): string[] {
  const out: string[] = [];
  const visit = (v: unknown, depth: number) => {
    if (typeof v === "string" && UUID.test(v)) out.push(v.toLowerCase());
    else if (Array.isArray(v) && depth < 2) v.forEach((x) => visit(x, depth + 1));
    else if (isRecord(v) && depth < 2) Object.values(v).forEach((x) => visit(x, depth + 1));
  };
  visit(payload, 0);
  return out;
}

/** Where an entry belongs on this job: its stage (null: none found) and the step it names, if any. */
export function placeOfEntry(
  entry: { kind: string; payload: unknown },
  lookup: PlaceLookup,
): { stage: StageRef | null; stepId: string | null } {
  const seen = new Set<string>();
  const atStep = (stepId: string) => ({ stage: lookup.stageOfStep.get(stepId) ?? null, stepId });
  let current: { kind: string; payload: unknown } | undefined = entry;
  for (let link = 0; current && link <= MAX_LINKS; link++) {
    const p: Record<string, unknown> = isRecord(current.payload) ? current.payload : {};
    if (typeof p.jobProcedureId === "string" && typeof p.stageKey === "string") {
      return { stage: { jobProcedureId: p.jobProcedureId, stageKey: p.stageKey }, stepId: null };
    }
    if (typeof p.stepId === "string") return atStep(p.stepId);
    const timerStep = typeof p.timerId === "string" ? lookup.stepOfTimer.get(p.timerId) : undefined;
    if (timerStep) return atStep(timerStep);
    const next: string | undefined = idsNamedIn(p).find((id) => lookup.operations.has(id) && !seen.has(id));
    if (!next) break;
    seen.add(next);
    current = lookup.operations.get(next);
  }
  return { stage: null, stepId: null };
}

const KIND_WORDS: Record<string, string> = {
  "step.completed": "Step done",
  "measurement.recorded": "Reading",
  "torque.bolt-confirmed": "Torque bolt",
  "timer.started": "Timer started",
  "timer.stopped": "Timer stopped",
  "timer.overridden": "Timer overridden",
  "photo.queued": "Photo",
  "stage.signed-off": "Stage sign-off",
  "part.fitted": "Part fitted",
};

/** What kind of entry it is, in workshop words (a kind this version does not know is "Bench entry"). */
export function entryKindLabel(kind: string): string {
  return KIND_WORDS[kind] ?? "Bench entry";
}

/**
 * One entry in workshop words, the same wherever it is named — the review's flagged list, a
 * decision refused for work not seen, the build report: "Reading: 0.43 mm (a correction)",
 * "Torque bolt: pass 1, bolt 3", "Step done". (The open items keep their own older wording, since
 * the stored report prints them and a change of words would show as a change in its next revision.)
 */
export function describeEntry(kind: string, payload: unknown): string {
  return [entryKindLabel(kind), entryDetail(kind, payload)].filter(Boolean).join(": ");
}

/** A short account of what the entry recorded, from its payload, for the known kinds; "" otherwise. */
export function entryDetail(kind: string, payload: unknown): string {
  const p = isRecord(payload) ? payload : {};
  const s = (k: string) => (typeof p[k] === "string" || typeof p[k] === "number" ? String(p[k]) : "");
  switch (kind) {
    case "measurement.recorded":
      return [s("value") && `${s("value")} ${s("unit")}`.trim(), s("supersedesId") ? "(a correction)" : ""].filter(Boolean).join(" ");
    case "torque.bolt-confirmed":
      return `pass ${s("passIndex")}, bolt ${s("bolt")}`;
    case "part.fitted":
      return [s("partNumber"), s("serial") && `serial ${s("serial")}`, s("batch") && `batch ${s("batch")}`].filter(Boolean).join(", ");
    case "timer.started":
    case "timer.overridden":
      return s("label") || s("reason");
    case "photo.queued":
      return s("caption");
    default:
      return "";
  }
}
