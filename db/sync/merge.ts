import "server-only";
import type { Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import type { SyncResponse } from "@/lib/sync/changes";
import { decideOperation, noteAccepted, sortByStamp, type Actor } from "@/lib/sync/merge-rules";
import type { Operation, SyncBatch } from "@/lib/sync/operations";
import type { AuditEntry } from "../audit/append";
import type { Database } from "../schema";
import { changesSince } from "./changes";
import { existingOperations, loadWorkOrderFacts, loadMergeState } from "./context";
import { appendAuditBatch, lockShopForSync, refusalsOnRecord, writeKept, type KeptOperation } from "./write";

/**
 * Merges one batch from a tablet's outbox, in one transaction (all of it is saved, or none).
 *
 * 1. Takes the shop's sync lock, so merges in a shop run one after another.
 * 2. Sets aside operations already on file (a resent batch): they are `duplicates`.
 * 3. Loads the facts the rules need (jobs, pinned procedures, send-backs, referenced records).
 * 4. Decides each new operation in stamp order with lib/sync/merge-rules.
 * 5. Inserts the kept ones into `operations` (ON CONFLICT (id) DO NOTHING), the read tables and
 *    the audit log in one statement; audits the refused ones in another.
 * 6. Answers with the outcome of each operation and the changes from elsewhere after the cursor.
 *
 * Resending the same batch, or the rest of a batch that was cut off, leaves the database as if it
 * had arrived once: nothing is inserted twice and no audit row is repeated.
 */
export async function mergeBatch(
  db: Kysely<Database>,
  user: SessionUser,
  batch: SyncBatch,
  opts: { nowMs?: number } = {},
): Promise<SyncResponse> {
  const actor: Actor = { id: user.id, shopId: user.shopId, role: user.role };
  const cursor = batch.cursor === null ? null : Number(batch.cursor);
  const nowMs = opts.nowMs ?? Date.now();

  return db.transaction().execute(async (trx) => {
    await lockShopForSync(trx, actor.shopId);

    // The same id twice in one batch counts once.
    const byId = new Map<string, Operation>();
    for (const op of batch.operations) if (!byId.has(op.id)) byId.set(op.id, op);
    const onFile = await existingOperations(trx, [...byId.keys()]);

    const duplicates: string[] = [];
    const refused: { id: string; reason: string; op: Operation }[] = [];
    const fresh: Operation[] = [];
    for (const op of byId.values()) {
      const author = onFile.get(op.id);
      if (author === undefined) fresh.push(op);
      else if (author === actor.id) duplicates.push(op.id);
      else refused.push({ id: op.id, op, reason: `Operation id ${op.id} is already used by another user's operation.` });
    }

    const ordered = sortByStamp(fresh);
    const jobs = await loadWorkOrderFacts(trx, actor.shopId, [...new Set(ordered.map((o) => o.workOrderId))]);
    const state = await loadMergeState(trx, ordered);

    let kept: KeptOperation[] = [];
    for (const op of ordered) {
      const decision = decideOperation(op, { actor, batchDeviceId: batch.deviceId, cursor, nowMs, job: jobs.get(op.workOrderId), state });
      if (decision.outcome === "refuse") {
        refused.push({ id: op.id, reason: decision.reason, op });
      } else {
        kept.push({ op, decision });
        noteAccepted(op, state);
      }
    }

    const inserted = await writeKept(trx, actor.shopId, actor.id, kept, jobs, state);
    if (inserted.size !== kept.length) {
      // Only when another transaction stored the same id meanwhile: those are duplicates.
      for (const k of kept) if (!inserted.has(k.op.id)) duplicates.push(k.op.id);
      kept = kept.filter((k) => inserted.has(k.op.id));
    }

    // Accepted operations were audited by writeKept; refusals are audited here (once per reason).
    const logged = await refusalsOnRecord(
      trx,
      refused.map((r) => r.id),
    );
    await appendAuditBatch(
      trx,
      refused
        .filter((r) => !logged.has(`${r.id}\n${r.reason}`))
        .map((r): AuditEntry => ({
          shopId: actor.shopId,
          actorId: actor.id,
          deviceId: batch.deviceId,
          action: `sync.${r.op.kind}`,
          entity: "operation",
          entityId: r.id,
          // Only a job of this shop is linked; the named id stays in the detail.
          workOrderId: jobs.get(r.op.workOrderId)?.shopId === actor.shopId ? r.op.workOrderId : null,
          outcome: "refused",
          reason: r.reason,
          detail: { operation: r.op },
        })),
    );

    const page = await changesSince(trx, actor.shopId, batch.deviceId, cursor);
    return {
      accepted: kept.map((k) => k.op.id),
      duplicates,
      refused: refused.map(({ id, reason }) => ({ id, reason })),
      flagged: kept.flatMap((k) => (k.decision.outcome === "flag" ? [{ id: k.op.id, reason: k.decision.reason }] : [])),
      changes: page.changes,
      cursor: page.cursor,
      more: page.more,
    };
  });
}
