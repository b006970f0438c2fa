/**
 * What an outbox entry was, in workshop words, for the tablet's list of refused and held entries:
 * its kind, the job and step, and every value it holds (reading and unit, pass and bolt, note…).
 * A refused entry may be malformed in any way (that may be why it was refused), so nothing here
 * trusts its shape; texts are shown with unprintable characters made visible. Pure.
 */
import { hasLoneSurrogate } from "@/lib/safe-values";
import type { JobSnapshot } from "./snapshot";

export interface EntryDescription {
  /** What kind of work it was, e.g. "Reading" or "Torque: bolt confirmed". */
  what: string;
  /** The job, e.g. "#1030 · Kestrel Sprint 800 (GSW-0030)", or its id when the tablet has no copy. */
  job: string | null;
  /** The step, e.g. "Step 3 · Bore gauge cylinder 1". */
  step: string | null;
  details: Array<{ label: string; value: string }>;
  /** The tablet's time when it was recorded (ISO), when it carries a readable one. */
  recordedAt: string | null;
}

const KIND_NAMES: Record<string, string> = {
  "step.completed": "Step done",
  "measurement.recorded": "Reading",
  "torque.bolt-confirmed": "Torque: bolt confirmed",
  "timer.started": "Timer started",
  "timer.stopped": "Timer stopped",
  "timer.overridden": "Timer overridden",
  "photo.queued": "Photo",
  "stage.signed-off": "Stage sign-off",
  "part.fitted": "Part fitted",
  "clock.on": "Clocked on",
  "clock.off": "Clocked off",
};

const MAX_SHOWN = 300;

/** A text as it can be shown: control characters as their visible symbols (␀ for NUL), broken characters as �. */
export function visibleText(s: string): string {
  let out = "";
  for (let i = 0; i < s.length && out.length < MAX_SHOWN; i++) {
    const c = s.charCodeAt(i);
    if (c >= 0xd800 && c <= 0xdbff && i + 1 < s.length && !hasLoneSurrogate(s.slice(i, i + 2))) {
      out += s.slice(i, i + 2);
      i++;
    } else if (c >= 0xd800 && c <= 0xdfff) out += "\uFFFD";
    else if (c < 0x20 && c !== 0x0a) out += String.fromCharCode(0x2400 + c);
    else if (c === 0x7f) out += "\u2421";
    else out += s[i];
  }
  return s.length > MAX_SHOWN ? `${out}…` : out;
}

type Loose = Record<string, unknown>;
const record = (v: unknown): Loose => (v !== null && typeof v === "object" && !Array.isArray(v) ? (v as Loose) : {});

/** Any value as a short text for the list. */
function shown(v: unknown): string {
  if (typeof v === "string") return visibleText(v);
  if (typeof v === "number" || typeof v === "boolean") return String(v);
  if (v === null || v === undefined) return "—";
  try {
    return visibleText(JSON.stringify(v) ?? String(v));
  } catch {
    return "(cannot be shown)";
  }
}

function time(v: unknown): string | null {
  return typeof v === "string" && Number.isFinite(Date.parse(v)) ? new Date(Date.parse(v)).toISOString() : null;
}

function findStep(job: JobSnapshot | undefined, stepId: unknown) {
  if (!job || typeof stepId !== "string") return null;
  let index = 0;
  for (const p of job.procedures)
    for (const st of p.stages)
      for (const step of st.steps) {
        if (step.id === stepId) return { step, index };
        index++;
      }
  return null;
}

export function describeEntry(op: unknown, job: JobSnapshot | undefined, jobNumber?: number | null): EntryDescription {
  const o = record(op);
  const p = record(o.payload);
  const kind = typeof o.kind === "string" ? o.kind : null;
  const details: EntryDescription["details"] = [];
  const add = (label: string, v: unknown) => {
    if (v !== undefined) details.push({ label, value: shown(v) });
  };

  const found = findStep(job, p.stepId);
  const step = found
    ? `Step ${found.index + 1} · ${found.step.title}`
    : typeof p.stepId === "string"
      ? `Step ${visibleText(p.stepId)} (not in this tablet's copy of the job)`
      : null;
  const number = job?.workOrder.number ?? jobNumber ?? null;
  const jobText =
    number !== null
      ? `#${number}${job ? ` · ${job.bike.make} ${job.bike.model} (${job.bike.tagCode})` : ""}`
      : typeof o.workOrderId === "string"
        ? `Work order ${visibleText(o.workOrderId)}`
        : null;
  const timerLabel = (timerId: unknown) => job?.state.timers.find((t) => t.id === timerId)?.label;

  switch (kind) {
    case "measurement.recorded": {
      const spec = found?.step.measurementSpecs.find((m) => m.id === p.specId);
      const at = typeof p.readingIndex === "number" ? spec?.readingLabels[p.readingIndex] : undefined;
      add("Measurement", spec ? `${spec.label}${at ? ` · ${at}` : ""}` : p.specId);
      if (!at) add("Reading number", typeof p.readingIndex === "number" ? p.readingIndex + 1 : p.readingIndex);
      details.push({ label: "Value", value: `${shown(p.value)}${typeof p.unit === "string" ? ` ${visibleText(p.unit)}` : ""}` });
      add("Note", p.note);
      if (p.supersedesId !== undefined) add("Corrects", "an earlier reading of the same spot");
      break;
    }
    case "torque.bolt-confirmed": {
      const spec = found?.step.torqueSpecs.find((t) => t.id === p.torqueSpecId);
      add("Torque spec", spec ? spec.label : p.torqueSpecId);
      add("Pass", p.passIndex);
      add("Bolt", p.bolt);
      if (p.wrenchReading !== undefined) {
        details.push({ label: "Wrench reading", value: `${shown(p.wrenchReading)} ${shown(p.wrenchUnit)}` });
      }
      break;
    }
    case "timer.started":
      add("Timer", p.label);
      add("Duration", typeof p.durationS === "number" ? `${Math.round(p.durationS / 60)} min` : p.durationS);
      add("Started", p.startedAt);
      break;
    case "timer.stopped":
      add("Timer", timerLabel(p.timerId) ?? p.timerId);
      add("Stopped", p.stoppedAt);
      break;
    case "timer.overridden":
      add("Timer", timerLabel(p.timerId) ?? p.timerId);
      add("Reason", p.reason);
      break;
    case "photo.queued":
      add("Caption", p.caption);
      add("Size", typeof p.byteSize === "number" ? `${Math.max(1, Math.round(p.byteSize / 1024))} kB` : p.byteSize);
      break;
    case "stage.signed-off": {
      const proc = job?.procedures.find((x) => x.jobProcedureId === p.jobProcedureId);
      const stage = proc?.stages.find((s) => s.key === p.stageKey);
      add("Stage", stage ? `${proc!.name} · ${stage.title}` : p.stageKey);
      break;
    }
    case "part.fitted":
      add("Part number", p.partNumber);
      add("Description", p.description);
      add("Serial number", p.serial);
      add("Batch number", p.batch);
      add("Quantity", p.quantity);
      add("Supplier", p.supplier);
      break;
    case "clock.on": {
      const proc = job?.procedures.find((x) => x.jobProcedureId === p.jobProcedureId);
      const stage = proc?.stages.find((s) => s.key === p.stageKey);
      add("Clocked on at", p.startedAt);
      if (p.stageKey !== undefined) add("Stage", stage ? `${proc!.name} · ${stage.title}` : p.stageKey);
      break;
    }
    case "clock.off":
      add("Clocked off at", p.endedAt);
      break;
    case "step.completed":
      break;
    default:
      add("Entry as sent", op);
  }
  return {
    what: kind === null ? "Unreadable entry" : (KIND_NAMES[kind] ?? `Entry of kind "${visibleText(kind)}"`),
    job: jobText,
    step,
    details,
    recordedAt: time(o.deviceTime),
  };
}
