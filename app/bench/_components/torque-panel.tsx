"use client";

import { useState } from "react";
import { wrenchPlausibility } from "@/lib/bench/plausibility";
import { boltLayout } from "@/lib/calc/tightening-sequence";
import { canonicalDecimal } from "@/lib/sync/reading-value";
import type { StepView, TorqueProgress } from "@/lib/work-order-record";
import type { JobSnapshot } from "@/lib/sync/snapshot";
import { useBench } from "./bench-context";
import { BigButton } from "./big-button";
import { NumberKeypad, parseEntry } from "./number-keypad";
import { PlausibilityPrompt } from "./plausibility-prompt";
import { RecordButton } from "./record-button";
import { boltLabel, nextBolt, passTarget, useRecordBolt, type BoltTarget } from "./torque-record";
import { WithdrawEntry } from "./withdraw-entry";
import { formatTime } from "@/lib/format/dates";

/**
 * Every torque spec of a step: the bolt pattern showing where you are, the passes, and a wrench
 * reading for the bolt in hand. The drawing only shows; the confirm is the step's fixed
 * torque bar (`TorqueConfirmBar`), so a resting palm on the drawing records nothing.
 */
export function TorquePanel({
  jobId,
  view,
  held,
  people,
}: {
  jobId: string;
  view: StepView;
  held: boolean;
  people: JobSnapshot["people"];
}) {
  return (
    <div className="flex flex-col gap-4">
      {view.torque.map((t) => (
        <TorqueSpecPanel key={t.spec.id} jobId={jobId} view={view} progress={t} held={held} people={people} />
      ))}
    </div>
  );
}

function TorqueSpecPanel({
  jobId,
  view,
  progress,
  held,
  people,
}: {
  jobId: string;
  view: StepView;
  progress: TorqueProgress;
  held: boolean;
  people: JobSnapshot["people"];
}) {
  const { user } = useBench();
  const record = useRecordBolt(jobId, view);
  const [wrench, setWrench] = useState<string | null>(null);
  const [asking, setAsking] = useState<{ target: BoltTarget; text: string; reasons: string[] } | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const { spec, passes, sequence, confirmed, next } = progress;
  const target = nextBolt(progress);
  const layout = boltLayout(spec.pattern, spec.boltCount);
  const pass = next ? passes.find((p) => p.index === next.passIndex)! : passes[passes.length - 1];
  const order = new Map(sequence.map((b, i) => [b, i + 1]));
  const reading = wrench === null ? null : parseEntry(wrench);
  // kept as typed ("31.50"): the digits say what the wrench reads to
  const readingText = wrench === null ? null : canonicalDecimal(wrench);
  const name = (id: string) => people.find((p) => p.id === id)?.name ?? "someone";

  /** The wrench reading's first tap: refuse the impossible, question the unlikely, save the rest. */
  async function saveWrench(t: BoltTarget) {
    if (reading === null || readingText === null) return;
    const p = passes.find((x) => x.index === t.passIndex)!;
    const verdict = wrenchPlausibility(readingText, user.torqueUnit, p.kind === "torque" ? { value: p.target, unit: p.unit } : null);
    if (verdict.kind === "refuse") return setProblem(verdict.reason);
    if (verdict.kind === "confirm") return setAsking({ target: t, text: readingText, reasons: verdict.reasons });
    await keepWrench(t, readingText);
  }
  async function keepWrench(t: BoltTarget, text: string) {
    await record(t, text);
    setAsking(null);
    setProblem(null);
    setWrench(null);
  }

  const r = 0.06;
  // Fit the drawing to the bolts (a two-row head is wide and short, a flange square).
  const ys = layout.map((b) => b.y);
  const top = Math.min(...ys) - 0.12;
  const height = Math.max(...ys) - Math.min(...ys) + 0.28;
  return (
    <section
      aria-label={`Torque ${spec.label}`}
      className="rounded-xl border-4 border-steel-700 bg-white p-4"
      data-testid="torque-spec"
      data-spec={spec.id}
      data-confirmed={[...confirmed].sort().join(" ")}
    >
      <h3 className="text-2xl font-bold">{spec.label}</h3>
      <p className="text-lg">
        {spec.boltCount} bolts ·{" "}
        {spec.pattern === "cross" ? "cross pattern" : spec.pattern === "spiral-out" ? "centre outwards" : "in order"} · final{" "}
        {passTarget(
          { index: 0, kind: "torque", target: spec.finalValue, unit: spec.unit, percentOfFinal: 100, label: "" },
          user.torqueUnit,
        )}
        {spec.lubricant ? ` · ${spec.lubricant}` : ""}
      </p>
      {spec.torqueToYield && (
        <p className="mt-2 rounded-lg border-4 border-ink bg-signal p-2 text-lg font-bold">
          ⚠ Torque-to-yield: new bolts only, never reused.
        </p>
      )}
      <ol className="mt-2 flex flex-wrap gap-2" aria-label="Passes">
        {passes.map((p) => {
          const state = next === null || p.index < next.passIndex ? "done" : p.index === next.passIndex ? "now" : "later";
          return (
            <li
              key={p.index}
              className={`rounded-lg border-2 px-3 py-1 text-lg font-bold ${state === "done" ? "border-pass bg-pass-light text-pass" : state === "now" ? "border-ink bg-signal" : "border-steel-300 text-steel-700"}`}
            >
              {state === "done" ? "✔ " : ""}Pass {p.index}: {p.label}
            </li>
          );
        })}
      </ol>
      <div className="mt-3 grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <figure className="rounded-xl border-4 border-steel-300 bg-steel-50 p-2" data-testid="bolt-drawing">
          <svg
            viewBox={`-0.1 ${top} 1.2 ${height}`}
            className="mx-auto w-full max-w-md"
            role="img"
            aria-label={`Bolt pattern, ${spec.boltCount} bolts${next ? `; bolt ${next.bolt} is next` : ""}`}
          >
            {layout.map((b) => {
              const isNext = next?.bolt === b.bolt;
              const isDone = next ? confirmed.has(`${next.passIndex}:${b.bolt}`) : true;
              return (
                <g key={b.bolt} data-bolt={b.bolt} data-state={isNext ? "next" : isDone ? "done" : "todo"}>
                  <circle
                    cx={b.x}
                    cy={b.y}
                    r={isNext ? r * 1.35 : r}
                    style={{ fill: isNext ? "var(--c-signal)" : isDone ? "var(--c-pass)" : "var(--c-white)", stroke: "var(--c-ink)" }}
                    strokeWidth={isNext ? 0.02 : 0.01}
                  />
                  <text
                    x={b.x}
                    y={b.y}
                    dy="0.025"
                    textAnchor="middle"
                    fontSize={isNext ? 0.075 : 0.06}
                    fontWeight="bold"
                    style={{ fill: isDone && !isNext ? "var(--c-white)" : "var(--c-ink)" }}
                  >
                    {b.bolt}
                  </text>
                  <text x={b.x} y={b.y + r * 1.35 + 0.05} textAnchor="middle" fontSize="0.035" style={{ fill: "var(--c-steel-700)" }}>
                    #{order.get(b.bolt)}
                  </text>
                </g>
              );
            })}
          </svg>
          <figcaption className="text-center text-base">
            Where you are: the next bolt is ringed. Confirm with the bar at the bottom.
          </figcaption>
        </figure>
        <div className="flex flex-col gap-3">
          {next ? (
            <>
              <p className="text-2xl font-bold" data-testid="torque-next">
                Pass {next.passIndex} of {passes.length}: bolt {next.bolt} ({next.positionInPass + 1} of {sequence.length})
              </p>
              <p className="font-mono text-2xl" data-testid="torque-target">
                {passTarget(pass, user.torqueUnit)}
              </p>
              {wrench === null ? (
                <BigButton tone="plain" disabled={held} onClick={() => setWrench("")}>
                  Record the wrench reading instead
                </BigButton>
              ) : (
                <div className="flex flex-col gap-2">
                  <NumberKeypad
                    value={wrench}
                    onChange={(v) => {
                      setWrench(v);
                      setAsking(null);
                      setProblem(null);
                    }}
                    label={`Wrench reading in ${user.torqueUnit}`}
                  />
                  {problem && (
                    <p role="alert" className="rounded-lg border-4 border-fail bg-fail-light p-3 text-lg font-bold text-fail">
                      ✖ Not saved: {problem}
                    </p>
                  )}
                  {asking ? (
                    <PlausibilityPrompt
                      reasons={asking.reasons}
                      value={`${asking.text} ${user.torqueUnit} for bolt ${asking.target.bolt}, pass ${asking.target.passIndex}`}
                      onConfirm={() => void keepWrench(asking.target, asking.text)}
                      onBack={() => setAsking(null)}
                    />
                  ) : (
                    <RecordButton
                      target={target}
                      disabled={reading === null || reading <= 0 || held}
                      onRecord={saveWrench}
                      className="border-pass bg-pass text-xl text-white disabled:border-steel-300 disabled:bg-steel-100 disabled:text-steel-700"
                    >
                      Save {user.torqueUnit} reading for bolt {next.bolt}
                    </RecordButton>
                  )}
                </div>
              )}
            </>
          ) : (
            <p className="text-2xl font-bold text-pass" data-testid="torque-done">
              ✔ Every pass done on all {spec.boltCount} bolts
            </p>
          )}
        </div>
      </div>
      {progress.records.length > 0 && <BoltRecords jobId={jobId} progress={progress} name={name} />}
    </section>
  );
}

/** The bolts recorded for a spec, newest first, each with its state; the mechanic's own (or any, for a supervisor) can be withdrawn. */
function BoltRecords({ jobId, progress, name }: { jobId: string; progress: TorqueProgress; name: (id: string) => string }) {
  const records = [...progress.records].reverse();
  const withdrawn = records.filter((r) => r.withdrawn).length;
  return (
    <details className="mt-3 rounded-xl border-2 border-steel-300 p-2">
      <summary className="flex min-h-target cursor-pointer items-center text-lg font-bold">
        Bolts recorded ({records.length - withdrawn}
        {withdrawn ? `, ${withdrawn} withdrawn` : ""}) — take one back if it was a mistake
      </summary>
      <ul className="mt-2 flex flex-col gap-2" aria-label={`Bolts recorded, ${progress.spec.label}`}>
        {records.map((r) => (
          <li
            key={r.operationId}
            className="flex flex-wrap items-center gap-3 rounded-lg border-2 border-steel-300 p-2 text-lg"
            data-testid="bolt-record"
          >
            <span className={`flex-1 ${r.withdrawn ? "line-through" : "font-bold"}`}>
              Bolt {r.bolt}, pass {r.passIndex} · {name(r.recordedBy)} · {formatTime(r.deviceTime)}
              {r.wrench ? ` · ${r.wrench}` : ""}
              {r.pending ? " · ⏳ waiting to send" : ""}
            </span>
            {r.flagReason && <span className="w-full font-bold text-warn">⚑ {r.flagReason}</span>}
            {r.withdrawn ? (
              <span className="w-full font-bold text-fail">
                ⊘ Withdrawn: “{r.withdrawn.reason}”{r.withdrawn.pending ? " (waiting to send)" : ""}
              </span>
            ) : (
              <WithdrawEntry
                jobId={jobId}
                operationId={r.operationId}
                recordedBy={r.recordedBy}
                what={`bolt ${r.bolt}, pass ${r.passIndex}`}
              />
            )}
          </li>
        ))}
      </ul>
    </details>
  );
}

/**
 * The step's torque confirm, in a fixed place: a bar held at the bottom of the screen while the
 * step has a bolt to tighten. It names the bolt, pass and target it will record.
 */
export function TorqueConfirmBar({ jobId, view, held }: { jobId: string; view: StepView; held: boolean }) {
  const { user } = useBench();
  const record = useRecordBolt(jobId, view);
  const [last, setLast] = useState<string | null>(null);
  const progress = view.torque.find((t) => !t.complete);
  if (!progress) return null;
  const target = nextBolt(progress)!;
  const many = view.torque.length > 1;
  return (
    <div className="no-print sticky bottom-0 z-30 -mx-4 border-t-4 border-ink bg-paper px-4 pb-4 pt-2" data-testid="torque-bar">
      <p className="text-lg" role="status">
        {last ? <span className="font-bold text-pass">✔ Recorded: {last}. </span> : null}
        {held ? (
          <span className="font-bold text-warn">⏳ On hold: this step waits for its timer (see the top of the step).</span>
        ) : (
          <>Tap when the bolt is tightened{many ? ` (${progress.spec.label})` : ""}:</>
        )}
      </p>
      <RecordButton
        target={target}
        disabled={held}
        testId="torque-confirm"
        onRecord={async (t) => {
          await record(t);
          setLast(`bolt ${t.bolt}, pass ${t.passIndex}`);
        }}
        className="mt-1 flex min-h-24 w-full items-center justify-center gap-3 border-pass bg-pass text-2xl text-white disabled:border-steel-700 disabled:bg-steel-100 disabled:text-ink md:text-3xl"
      >
        <span aria-hidden="true">✔</span>
        <span>{boltLabel(progress, target, user.torqueUnit)}</span>
      </RecordButton>
    </div>
  );
}
