"use client";

import { useState } from "react";
import { readingPlausibility } from "@/lib/bench/plausibility";
import { boreGeometry } from "@/lib/calc/bore-geometry";
import { evaluateTolerance } from "@/lib/calc/tolerance";
import { canonicalDecimal } from "@/lib/sync/reading-value";
import { readingCount, type MeasurementSpecView, type ReadingView, type StepView } from "@/lib/work-order-record";
import { recordOperation } from "@/lib/client/bench-store";
import { useAuthor, useBench } from "./bench-context";
import { BigButton } from "./big-button";
import { NumberKeypad, parseEntry } from "./number-keypad";
import { PlausibilityPrompt } from "./plausibility-prompt";
import { Verdict } from "./verdict";

// Decimal places written in a value's text ("76.0040" → 4: the instrument's resolution, trailing zeros included).
function decimalsOf(text: string | number): number {
  const s = String(text);
  if (s.includes("e")) return 12;
  return s.includes(".") ? s.length - s.indexOf(".") - 1 : 0;
}

// A difference of readings is exact at the readings' own decimal places: shown there, without the
// binary floating-point noise of the subtraction. Readings themselves are shown exactly as typed.
function derived(x: number, ...inputs: Array<string | number>): string {
  return x.toFixed(Math.max(0, ...inputs.map(decimalsOf)));
}

function specLine(spec: MeasurementSpecView): string {
  const n = spec.nominal === null ? "" : `nominal ${spec.nominal} · `;
  return `${n}min ${spec.min} · max ${spec.max} ${spec.unit}`;
}

/**
 * Readings for every spec of a step: pick a slot, type on the pad, see the verdict at once. The
 * value is saved exactly as typed ("0.030"); an unlikely one is questioned before it is saved.
 * While the step is held, nothing can be saved.
 */
export function MeasurementPanel({ jobId, view, held }: { jobId: string; view: StepView; held: boolean }) {
  return (
    <div className="flex flex-col gap-4">
      {view.step.measurementSpecs.map((spec) => (
        <SpecReadings key={spec.id} jobId={jobId} view={view} spec={spec} held={held} />
      ))}
    </div>
  );
}

function SpecReadings({ jobId, view, spec, held }: { jobId: string; view: StepView; spec: MeasurementSpecView; held: boolean }) {
  const { db, syncNow } = useBench();
  const author = useAuthor();
  const count = readingCount(spec);
  const current = view.current.get(spec.id) ?? new Map<number, ReadingView>();
  const history = view.readings.get(spec.id) ?? [];
  const firstEmpty = Array.from({ length: count }, (_, i) => i).find((i) => !current.has(i)) ?? 0;
  const [slot, setSlot] = useState(firstEmpty);
  const [entry, setEntry] = useState("");
  const [note, setNote] = useState("");
  const [saved, setSaved] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [asking, setAsking] = useState<string[] | null>(null);
  const value = parseEntry(entry);
  const text = value === null ? null : canonicalDecimal(entry);
  const live =
    value === null
      ? null
      : evaluateTolerance(
          { value, unit: spec.unit },
          { unit: spec.unit, min: spec.min, max: spec.max, ...(spec.nominal === null ? {} : { nominal: spec.nominal }) },
        );
  const label = (i: number) => spec.readingLabels[i] ?? (count > 1 ? `Reading ${i + 1}` : "Reading");

  /** First tap: refuse the impossible, question the unlikely, save the rest. */
  function check(): Promise<void> | undefined {
    if (text === null || held) return;
    const verdict = readingPlausibility(text, spec);
    setSaved(null);
    if (verdict.kind === "refuse") setProblem(verdict.reason);
    else if (verdict.kind === "confirm") setAsking(verdict.reasons);
    else return save(text);
  }

  async function save(typed: string) {
    setAsking(null);
    setProblem(null);
    const previous = current.get(slot);
    await recordOperation(db, author, jobId, "measurement.recorded", {
      stepId: view.step.id,
      specId: spec.id,
      readingIndex: slot,
      value: typed,
      unit: spec.unit,
      ...(note.trim() ? { note: note.trim() } : {}),
      ...(previous ? { supersedesId: previous.id } : {}),
    });
    setSaved(`${label(slot)}: ${typed} ${spec.unit} saved${previous ? " (correction; the earlier reading stays on record)" : ""}`);
    setEntry("");
    setNote("");
    const next = Array.from({ length: count }, (_, i) => i).find((i) => i !== slot && !current.has(i));
    if (next !== undefined) setSlot(next);
    syncNow();
  }

  const bore = spec.geometry === "bore" && count === 6 && [0, 1, 2, 3, 4, 5].every((i) => current.has(i)) ? boreFrom(current, spec) : null;

  return (
    <section aria-label={`Measure ${spec.label}`} className="rounded-xl border-4 border-steel-700 bg-white p-4">
      <h3 className="text-2xl font-bold">{spec.label}</h3>
      <p className="font-mono text-lg" data-testid="spec-line">
        Spec: {specLine(spec)}
      </p>
      <div className="mt-3 grid gap-4 lg:grid-cols-2">
        <div className="flex flex-col gap-2">
          {Array.from({ length: count }, (_, i) => {
            const r = current.get(i);
            return (
              <button
                key={i}
                type="button"
                aria-pressed={slot === i}
                onClick={() => setSlot(i)}
                data-testid="reading-slot"
                data-index={i}
                className={`flex min-h-target items-center gap-3 rounded-lg border-4 px-3 text-left text-lg ${slot === i ? "border-signal-dark bg-signal/30" : "border-steel-300 bg-white"}`}
              >
                <span className="flex-1 font-bold">{label(i)}</span>
                {r ? (
                  <>
                    <span className="font-mono text-xl" data-testid="reading-value">
                      {r.value} {r.unit}
                    </span>
                    <Verdict status={r.verdict} compact />
                  </>
                ) : (
                  <span className="text-steel-700">not read</span>
                )}
              </button>
            );
          })}
          {bore && (
            <p className="rounded-lg border-2 border-steel-700 p-2 font-mono text-lg" data-testid="bore-geometry">
              Taper (max) {derived(bore.taper.max, ...bore.inputs)} {spec.unit} · out-of-round (max){" "}
              {derived(bore.outOfRound.max, ...bore.inputs)} {spec.unit}
            </p>
          )}
        </div>
        <div className="flex flex-col gap-2">
          <p className="text-lg font-bold">Reading for: {label(slot)}</p>
          <NumberKeypad
            value={entry}
            onChange={(v) => {
              setEntry(v);
              setAsking(null);
              setProblem(null);
            }}
            label={`${spec.label} ${label(slot)} in ${spec.unit}`}
          />
          <div className="min-h-12" aria-live="polite">
            {live && (
              <p className="flex flex-wrap items-center gap-3">
                <Verdict status={live.status} />
                <span className="font-mono text-lg">
                  {live.deviation >= 0 ? "+" : ""}
                  {derived(live.deviation, text ?? value!, live.nominal)} {spec.unit} from nominal
                </span>
              </p>
            )}
          </div>
          {live && live.status !== "in" && (
            <label className="flex flex-col gap-1 text-lg font-bold">
              Note for the supervisor (optional)
              <input
                value={note}
                onChange={(e) => setNote(e.target.value)}
                className="min-h-target rounded-lg border-2 border-steel-700 px-3 text-lg font-normal"
              />
            </label>
          )}
          {problem && (
            <p role="alert" className="rounded-lg border-4 border-fail bg-fail-light p-3 text-lg font-bold text-fail">
              ✖ Not saved: {problem}
            </p>
          )}
          {asking && text !== null ? (
            <PlausibilityPrompt
              reasons={asking}
              value={`${text} ${spec.unit}`}
              onConfirm={() => save(text)}
              onBack={() => setAsking(null)}
            />
          ) : (
            <BigButton tone="go" records disabled={value === null || held} onClick={check}>
              {held ? "On hold: saving is off" : "Save reading"}
            </BigButton>
          )}
          {saved && (
            <p role="status" className="text-lg font-bold">
              {saved}
            </p>
          )}
        </div>
      </div>
      {history.length > count && (
        <details className="mt-3">
          <summary className="cursor-pointer text-lg font-bold">All readings on record ({history.length})</summary>
          <ul className="mt-2 font-mono">
            {history.map((r) => (
              <li key={r.id}>
                {label(r.readingIndex)}: {r.value} {r.unit} — {r.verdict}
                {r.pending ? " (waiting to send)" : ""} {r.note ? `— ${r.note}` : ""}
              </li>
            ))}
          </ul>
        </details>
      )}
    </section>
  );
}

// Reading order for a bore spec: top thrust, top pin, middle thrust, middle pin, bottom thrust, bottom pin.
function boreFrom(current: Map<number, ReadingView>, spec: MeasurementSpecView) {
  const v = (i: number) => Number(current.get(i)!.value);
  if ([0, 1, 2, 3, 4, 5].some((i) => current.get(i)!.unit !== spec.unit)) return null;
  const geometry = boreGeometry({
    top: { thrust: v(0), pin: v(1) },
    middle: { thrust: v(2), pin: v(3) },
    bottom: { thrust: v(4), pin: v(5) },
  });
  return { ...geometry, inputs: [0, 1, 2, 3, 4, 5].map((i) => current.get(i)!.value) };
}
