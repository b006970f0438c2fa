/** Torque sequences: which bolt of which pass is done, and the next one to tighten. */
import { torqueStages } from "@/lib/calc/torque-stages";
import { tighteningSequence } from "@/lib/calc/tightening-sequence";
import type { PendingWork } from "./pending";
import type { Snapshot, TorqueProgress, TorqueSpecView } from "./types";

/** "torqueSpecId|pass:bolt" of every bolt on record or waiting on this tablet. */
export function confirmedBolts(snapshot: Snapshot, work: PendingWork): Set<string> {
  return new Set([
    ...snapshot.state.torqueRecords.map((t) => `${t.torqueSpecId}|${t.passIndex}:${t.bolt}`),
    ...work.ofKind("torque.bolt-confirmed").map((o) => `${o.payload.torqueSpecId}|${o.payload.passIndex}:${o.payload.bolt}`),
  ]);
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
