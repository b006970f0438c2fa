/** Readings of a work order: those on record and those waiting, the current one per spot, what is still to read. */
import { expectedReadings } from "@/lib/procedures/spec-counts";
import { compareStamps } from "@/lib/sync/hlc";
import { readingVerdict } from "@/lib/sync/readings";
import { decimalOfNumber } from "@/lib/sync/reading-value";
import type { PendingWork } from "./pending";
import type { BenchStep, MeasurementSpecView, ReadingView, Snapshot } from "./types";

/** Readings per spec a step expects: the rule written once in lib/procedures/spec-counts.ts. */
export function readingCount(spec: MeasurementSpecView): number {
  return expectedReadings(spec.readingLabels);
}

function findSpec(snapshot: Snapshot, specId: string): MeasurementSpecView | undefined {
  for (const p of snapshot.procedures)
    for (const s of p.stages) for (const st of s.steps) for (const m of st.measurementSpecs) if (m.id === specId) return m;
  return undefined;
}

/** Every reading of the work order: server ones, then waiting ones (verdict worked out here), each value as typed. */
export function readingViews(snapshot: Snapshot, work: PendingWork): ReadingView[] {
  return [
    // A copy stored before values came as text has the number only: shown as the decimal it prints as.
    ...snapshot.state.readings.map(({ valueText, ...r }) => ({
      ...r,
      value: valueText ?? decimalOfNumber(r.value) ?? String(r.value),
      pending: false,
    })),
    ...work.ofKind("measurement.recorded").map((o) => {
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
}

export interface StepReadings {
  readings: Map<string, ReadingView[]>;
  current: Map<string, Map<number, ReadingView>>;
  missing: string[];
  outOfTolerance: number;
}

/** One step's readings by spec (stamp order), the current one per reading index, and what is still to read. */
export function stepReadings(step: BenchStep, all: readonly ReadingView[], current: readonly ReadingView[]): StepReadings {
  const readings = new Map<string, ReadingView[]>();
  const currentBySpec = new Map<string, Map<number, ReadingView>>();
  const missing: string[] = [];
  let outOfTolerance = 0;
  for (const spec of step.measurementSpecs) {
    readings.set(
      spec.id,
      all.filter((r) => r.specId === spec.id).sort((a, b) => compareStamps(a.stamp, b.stamp)),
    );
    const perIndex = new Map<number, ReadingView>();
    for (const r of current) if (r.specId === spec.id) perIndex.set(r.readingIndex, r);
    currentBySpec.set(spec.id, perIndex);
    const count = readingCount(spec);
    const have = [...perIndex.keys()].filter((i) => i < count).length;
    if (have < count) missing.push(`${spec.label}: ${count - have} of ${count} reading${count > 1 ? "s" : ""} to record`);
    outOfTolerance += [...perIndex.values()].filter((r) => r.verdict !== "in").length;
  }
  return { readings, current: currentBySpec, missing, outOfTolerance };
}
