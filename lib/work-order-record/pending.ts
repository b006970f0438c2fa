/**
 * Work still on this tablet, laid on top of the server's snapshot. An operation the snapshot
 * already holds (a copy fetched after it was sent) is left out, so nothing is counted twice.
 */
import type { Operation, OperationKind } from "@/lib/sync/operations";
import type { Snapshot } from "./types";

export type OperationOf<K extends OperationKind> = Extract<Operation, { kind: K }>;

/** The ids the snapshot's rows carry for each kind of operation (the merge keeps them). */
function recordedIds(snapshot: Snapshot): Set<string> {
  const s = snapshot.state;
  return new Set([
    ...s.completions.map((c) => c.id),
    ...s.readings.map((r) => r.id),
    ...s.torqueRecords.map((t) => t.id),
    ...s.signOffs.map((x) => x.id),
    ...s.timers.map((t) => `timer:${t.id}`),
    ...s.photos.map((p) => `photo:${p.id}`),
    // A snapshot stored before parts (or withdrawals) were part of it has none.
    ...(s.parts ?? []).map((p) => `part:${p.id}`),
    ...(s.withdrawals ?? []).map((w) => w.id),
    ...(s.clocks ?? []).flatMap((c) => [c.operationId, ...c.ends.flatMap((e) => (e.operationId ? [e.operationId] : []))]),
  ]);
}

function recordKey(op: Operation): string | null {
  switch (op.kind) {
    case "timer.started":
      return `timer:${op.payload.timerId}`;
    case "photo.queued":
      return `photo:${op.payload.attachmentId}`;
    case "part.fitted":
      return `part:${op.payload.partFittedId}`;
    case "timer.stopped":
    case "timer.overridden":
    case "timer.cancelled":
      return null; // they change a timer row; the snapshot's own stop, cancel or override wins (see timers.ts)
    default:
      return op.id; // a withdrawal that is not the first of its entry is not in the snapshot: it stays drawn, and changes nothing
  }
}

export interface PendingWork {
  all: Operation[];
  ofKind<K extends OperationKind>(kind: K): OperationOf<K>[];
}

/** This job's operations from `pending` that the snapshot does not hold yet, in the order given. */
export function pendingOnTop(snapshot: Snapshot, pending: readonly Operation[]): PendingWork {
  const onRecord = recordedIds(snapshot);
  const all = pending.filter((o) => {
    if (o.workOrderId !== snapshot.workOrder.id) return false;
    const key = recordKey(o);
    return key === null || !onRecord.has(key);
  });
  return {
    all,
    ofKind: <K extends OperationKind>(kind: K) => all.filter((o): o is OperationOf<K> => o.kind === kind),
  };
}
