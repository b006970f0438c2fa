/** Entries withdrawn: on record (the snapshot's withdrawals) and waiting on this tablet. The first withdrawal of an entry stands. */
import type { PendingWork } from "./pending";
import type { Snapshot, WithdrawalView } from "./types";

/** Withdrawn operation id → who withdrew it, when and why. */
export function withdrawnEntries(snapshot: Snapshot, work: PendingWork): Map<string, WithdrawalView> {
  const out = new Map<string, WithdrawalView>();
  // A snapshot stored before withdrawals were part of it has none.
  for (const w of snapshot.state.withdrawals ?? []) {
    if (!out.has(w.operationId)) out.set(w.operationId, { by: w.withdrawnBy, at: w.deviceTime, reason: w.reason, pending: false });
  }
  for (const o of work.ofKind("entry.withdrawn")) {
    if (!out.has(o.payload.operationId))
      out.set(o.payload.operationId, { by: o.authorId, at: o.deviceTime, reason: o.payload.reason, pending: true });
  }
  return out;
}
