"use client";

import { useState } from "react";
import { boltLayout } from "@/lib/calc/tightening-sequence";
import { convertTorque, type TorqueUnit } from "@/lib/calc/units";
import type { TorqueProgress, StepView } from "@/lib/bench/job-view";
import { recordOperation } from "@/lib/client/outbox";
import { useBench } from "./bench-context";
import { BigButton } from "./big-button";
import { NumberKeypad, parseEntry } from "./number-keypad";

function fmt(v: number): string {
  return Number.parseFloat(v.toPrecision(4)).toString();
}

/** Target of a torque pass in the shop's unit with the other unit beside it. */
export function passTarget(p: TorqueProgress["passes"][number], shopUnit: "N·m" | "lbf·ft"): string {
  if (p.kind === "angle") return `turn a further ${p.target}°`;
  const other: TorqueUnit = shopUnit === "N·m" ? "lbf·ft" : "N·m";
  const main = convertTorque(p.target, p.unit, shopUnit);
  const alt = convertTorque(p.target, p.unit, other);
  return `${fmt(main)} ${shopUnit} (${fmt(alt)} ${other})`;
}

/** Every torque spec of a step: the bolt pattern, the pass in hand, and the next bolt. */
export function TorquePanel({ jobId, view }: { jobId: string; view: StepView }) {
  return (
    <div className="flex flex-col gap-4">
      {view.torque.map((t) => (
        <TorqueSpecPanel key={t.spec.id} jobId={jobId} view={view} progress={t} />
      ))}
    </div>
  );
}

function TorqueSpecPanel({ jobId, view, progress }: { jobId: string; view: StepView; progress: TorqueProgress }) {
  const { db, user, deviceId, syncNow } = useBench();
  const [wrench, setWrench] = useState<string | null>(null);
  const { spec, passes, sequence, confirmed, next } = progress;
  const layout = boltLayout(spec.pattern, spec.boltCount);
  const pass = next ? passes.find((p) => p.index === next.passIndex)! : passes[passes.length - 1];
  const order = new Map(sequence.map((b, i) => [b, i + 1]));

  async function confirm(reading?: number) {
    if (!next) return;
    await recordOperation(db, { userId: user.id, deviceId }, jobId, "torque.bolt-confirmed", {
      stepId: view.step.id,
      torqueSpecId: spec.id,
      passIndex: next.passIndex,
      bolt: next.bolt,
      ...(reading !== undefined ? { wrenchReading: reading, wrenchUnit: user.torqueUnit } : {}),
    });
    setWrench(null);
    if (next.positionInPass === sequence.length - 1) syncNow();
  }

  const r = 0.06;
  // Fit the drawing to the bolts (a two-row head is wide and short, a flange square).
  const ys = layout.map((b) => b.y);
  const top = Math.min(...ys) - 0.12;
  const height = Math.max(...ys) - Math.min(...ys) + 0.28;
  return (
    <section aria-label={`Torque ${spec.label}`} className="rounded-xl border-4 border-steel-700 bg-white p-4">
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
        <button
          type="button"
          onClick={() => confirm()}
          disabled={!next}
          aria-label={next ? `Confirm bolt ${next.bolt} tightened` : "All passes done"}
          className="rounded-xl border-4 border-steel-900 bg-steel-50 p-2 disabled:cursor-default"
        >
          <svg
            viewBox={`-0.1 ${top} 1.2 ${height}`}
            className="mx-auto w-full max-w-md"
            role="img"
            aria-label={`Bolt pattern, ${spec.boltCount} bolts`}
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
          <span className="sr-only">Tap to confirm the highlighted bolt</span>
        </button>
        <div className="flex flex-col gap-3">
          {next ? (
            <>
              <p className="text-2xl font-bold" data-testid="torque-next">
                Pass {next.passIndex} of {passes.length}: bolt {next.bolt} ({next.positionInPass + 1} of {sequence.length})
              </p>
              <p className="font-mono text-2xl" data-testid="torque-target">
                {passTarget(pass, user.torqueUnit)}
              </p>
              <BigButton tone="go" onClick={() => confirm()} className="min-h-24 text-2xl">
                Bolt {next.bolt} done
              </BigButton>
              {wrench === null ? (
                <BigButton tone="plain" onClick={() => setWrench("")}>
                  Record the wrench reading instead
                </BigButton>
              ) : (
                <div className="flex flex-col gap-2">
                  <NumberKeypad value={wrench} onChange={setWrench} label={`Wrench reading in ${user.torqueUnit}`} />
                  <BigButton
                    tone="go"
                    disabled={parseEntry(wrench) === null || (parseEntry(wrench) ?? 0) <= 0}
                    onClick={() => confirm(parseEntry(wrench)!)}
                  >
                    Save {user.torqueUnit} reading for bolt {next.bolt}
                  </BigButton>
                </div>
              )}
            </>
          ) : (
            <p className="text-2xl font-bold text-pass" data-testid="torque-done">
              ✔ Every pass done on all {spec.boltCount} bolts
            </p>
          )}
          {spec.torqueToYield && (
            <p className="rounded-lg border-4 border-ink bg-signal p-2 text-lg font-bold">
              ⚠ Torque-to-yield: new bolts only, never reused.
            </p>
          )}
        </div>
      </div>
    </section>
  );
}
