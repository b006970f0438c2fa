"use client";

import { convertTorque, type TorqueUnit } from "@/lib/calc/units";
import { recordOperation } from "@/lib/client/bench-store";
import type { StepView, TorqueProgress } from "@/lib/work-order-record";
import { useAuthor, useBench } from "./bench-context";

/** One bolt of one pass: what a torque confirm records. */
export interface BoltTarget {
  torqueSpecId: string;
  passIndex: number;
  bolt: number;
  /** The last bolt of its pass (the tablet syncs after each finished pass). */
  endsPass: boolean;
}

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

/** The bolt a confirm shows now, or null when every pass is done. */
export function nextBolt(progress: TorqueProgress): BoltTarget | null {
  const { next, spec, sequence } = progress;
  return next
    ? { torqueSpecId: spec.id, passIndex: next.passIndex, bolt: next.bolt, endsPass: next.positionInPass === sequence.length - 1 }
    : null;
}

/** "Bolt 5 of 10 — pass 2 of 3 — 45 N·m (33.19 lbf·ft)": the bolt, pass and target a confirm records. */
export function boltLabel(progress: TorqueProgress, target: BoltTarget, shopUnit: "N·m" | "lbf·ft"): string {
  const pass = progress.passes.find((p) => p.index === target.passIndex)!;
  return `Bolt ${target.bolt} of ${progress.spec.boltCount} — pass ${target.passIndex} of ${progress.passes.length} — ${passTarget(pass, shopUnit)}`;
}

/** Records a bolt of a step's torque spec (with a wrench reading, as typed, when given); syncs after a finished pass. */
export function useRecordBolt(jobId: string, view: StepView): (target: BoltTarget, wrenchReading?: string) => Promise<void> {
  const { db, user, syncNow } = useBench();
  const author = useAuthor();
  return async (target, wrenchReading) => {
    await recordOperation(db, author, jobId, "torque.bolt-confirmed", {
      stepId: view.step.id,
      torqueSpecId: target.torqueSpecId,
      passIndex: target.passIndex,
      bolt: target.bolt,
      ...(wrenchReading !== undefined ? { wrenchReading, wrenchUnit: user.torqueUnit } : {}),
    });
    if (target.endsPass) syncNow();
  };
}
