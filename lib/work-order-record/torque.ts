/** Torque sequences: which bolt of which pass is done, and the next one to tighten. A withdrawn bolt does not count: it must be done again. */
import { torqueStages } from "@/lib/calc/torque-stages";
import { tighteningSequence } from "@/lib/calc/tightening-sequence";
import type { PendingWork } from "./pending";
import type { BoltRecordView, Snapshot, TorqueProgress, TorqueSpecView, WithdrawalView } from "./types";

/** Every bolt recorded on the job, on record or waiting on this tablet, by torque spec, with any withdrawal. */
export function boltRecords(
  snapshot: Snapshot,
  work: PendingWork,
  withdrawn: ReadonlyMap<string, WithdrawalView>,
): Map<string, BoltRecordView[]> {
  const bySpec = new Map<string, BoltRecordView[]>();
  const add = (specId: string, r: BoltRecordView) => bySpec.set(specId, [...(bySpec.get(specId) ?? []), r]);
  for (const t of snapshot.state.torqueRecords) {
    add(t.torqueSpecId, {
      operationId: t.id,
      passIndex: t.passIndex,
      bolt: t.bolt,
      recordedBy: t.recordedBy,
      deviceTime: t.deviceTime,
      wrench: t.wrenchReading === null ? null : `${t.wrenchReadingText ?? t.wrenchReading} ${t.wrenchUnit ?? ""}`.trim(),
      flagReason: t.flagged ? (t.flagReason ?? null) : null,
      withdrawn: withdrawn.get(t.id) ?? null,
      pending: false,
    });
  }
  for (const o of work.ofKind("torque.bolt-confirmed")) {
    const p = o.payload;
    add(p.torqueSpecId, {
      operationId: o.id,
      passIndex: p.passIndex,
      bolt: p.bolt,
      recordedBy: o.authorId,
      deviceTime: o.deviceTime,
      wrench: p.wrenchReading === undefined ? null : `${p.wrenchReading} ${p.wrenchUnit}`,
      flagReason: null,
      withdrawn: withdrawn.get(o.id) ?? null,
      pending: true,
    });
  }
  return bySpec;
}

/** Passes, tightening order and the next bolt for one torque spec, from its recorded bolts (withdrawn ones left out). */
export function torqueProgress(spec: TorqueSpecView, records: readonly BoltRecordView[]): TorqueProgress {
  const passes = torqueStages({ finalValue: spec.finalValue, unit: spec.unit, passes: spec.passes, anglePasses: spec.anglePasses });
  const sequence = tighteningSequence(spec.pattern, spec.boltCount);
  const counted = new Set(records.filter((r) => !r.withdrawn).map((r) => `${r.passIndex}:${r.bolt}`));
  const confirmed = new Set<string>();
  for (const p of passes) for (const b of sequence) if (counted.has(`${p.index}:${b}`)) confirmed.add(`${p.index}:${b}`);
  let next: TorqueProgress["next"] = null;
  outer: for (const p of passes) {
    for (const [i, b] of sequence.entries()) {
      if (!confirmed.has(`${p.index}:${b}`)) {
        next = { passIndex: p.index, bolt: b, positionInPass: i };
        break outer;
      }
    }
  }
  return { spec, passes, sequence, confirmed, records: [...records], next, complete: next === null };
}
