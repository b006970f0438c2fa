import "server-only";
import type { Kysely, Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import type { SyncResponse } from "@/lib/sync/changes";
import {
  decideOperation,
  noteAccepted,
  recordedStep,
  sortByStamp,
  targetPresent,
  targetsCreated,
  type Actor,
  type Decision,
} from "@/lib/sync/merge-rules";
import type { Operation, SyncBatch } from "@/lib/sync/operations";
import type { MalformedOperation } from "@/lib/sync/parse-batch";
import { withStockReason } from "@/lib/stock/draw";
import type { AuditEntry } from "../audit/append";
import { planStockDraws, returnWithdrawnDraws, writeStockDraws } from "../stock/draw";
import type { Database } from "../schema";
import { changesSince } from "./changes";
import { loadWorkOrderFacts, loadMergeState } from "./context";
import { batchOnFile, heldForTargets, holdOperations, resolveHeld, type HeldOperation } from "./pending";
import { appendAuditBatch, applyFirstOverrides, lockShopForSync, refusalsOnRecord, writeKept, type KeptOperation } from "./write";

/** A refusal to audit: the operation (or the storable copy of a malformed one), who sent it and why. */
interface Refused {
  id: string;
  reason: string;
  kind: string;
  workOrderId: string | null;
  actorId: string;
  deviceId: string;
  detail: Record<string, unknown>;
  /** Part of this request (answered), or a held operation refused when its record came (audited only). */
  answered: boolean;
}

/** An operation to decide as its author would have been decided on arrival: role, cursor and server time. */
type Candidate = Omit<HeldOperation, "target" | "reason">;

/**
 * Operations held for a record `ops` create, and for the records those create in turn (a
 * correction of a held correction), each target looked up once (`looked`), each held one fetched
 * once (`seen`).
 */
async function heldForRecordsOf(
  trx: Transaction<Database>,
  shopId: string,
  ops: readonly Operation[],
  looked: Set<string>,
  seen: Set<string>,
  /** Held operations already read for every record `ops` create (the first round, read with the batch's ids). */
  waitingForOps: readonly HeldOperation[],
): Promise<HeldOperation[]> {
  const out: HeldOperation[] = [];
  let targets = ops.flatMap(targetsCreated);
  for (let round = 0; ; round++) {
    const query = targets.filter((t) => !looked.has(t));
    if (!query.length) return out;
    for (const t of query) looked.add(t);
    const asked = new Set(query);
    const found = round
      ? await heldForTargets(trx, shopId, query, seen)
      : waitingForOps.filter((h) => asked.has(h.target.id) && !seen.has(h.op.id));
    for (const h of found) seen.add(h.op.id);
    out.push(...found);
    targets = found.flatMap((h) => targetsCreated(h.op));
  }
}

/**
 * Merges one batch from a tablet's outbox, in one transaction (all of it is saved, or none).
 *
 * 1. Takes the shop's sync lock, so merges in a shop run one after another.
 * 2. Sets aside operations already on file (a resent batch): they are `duplicates`; those already
 *    held (a resend of a late arrival) are `pending` again.
 * 3. Loads the facts the rules need (jobs, pinned procedures, send-backs, referenced records).
 * 4. Finds the operations held by earlier batches for a record this batch brings (and for the
 *    records those bring in turn), and decides them with the new operations, all in stamp order,
 *    with lib/sync/merge-rules: kept (perhaps flagged), refused, or held because the record it acts
 *    on has not arrived. So a withdrawal held for a part counts before a later part with its serial.
 * 5. Applies held operations whose record turned up later in that pass (a stamp out of causal
 *    order), round after round, until none is left.
 * 6. Plans the stock drawn by parts fitted (db/stock/draw.ts): a fit the shelf cannot cover is
 *    kept and flagged, and the draw stops at zero.
 * 7. Writes the kept ones into `operations`, the read tables and the audit log (by COPY, in stamp
 *    order: `writeKept`); audits the refused ones (the malformed ones too); holds the ones still
 *    waiting; writes the stock drawn by the fits stored.
 * 8. Answers with the outcome of each operation and the changes from elsewhere after the cursor.
 *
 * Resending the same batch, or the rest of a batch that was cut off, leaves the database as if it
 * had arrived once; any order of one device's operations across batches ends as one delivery does.
 */
export async function mergeBatch(
  db: Kysely<Database>,
  user: SessionUser,
  batch: SyncBatch & { malformed?: readonly MalformedOperation[] },
  opts: { nowMs?: number } = {},
): Promise<SyncResponse> {
  const actor: Actor = { id: user.id, shopId: user.shopId, role: user.role };
  const cursor = batch.cursor === null ? null : Number(batch.cursor);
  const nowMs = opts.nowMs ?? Date.now();
  const malformed = batch.malformed ?? [];

  return db.transaction().execute(async (trx) => {
    await lockShopForSync(trx, actor.shopId);

    // The same id twice in one batch counts once.
    const byId = new Map<string, Operation>();
    for (const op of batch.operations) if (!byId.has(op.id)) byId.set(op.id, op);
    const ids = [...byId.keys()];
    const {
      onFile,
      held: heldBefore,
      waiting: waitingForBatch,
    } = await batchOnFile(
      trx,
      actor.shopId,
      ids,
      [...byId.values()].flatMap(targetsCreated).filter((t) => !byId.has(t)),
    );

    const duplicates: string[] = [];
    const refused: Refused[] = [];
    const pending = new Map<string, string>();
    const refuse = (op: Operation, reason: string, by: { actorId: string; deviceId: string }, answered = true) =>
      refused.push({
        id: op.id,
        reason,
        kind: op.kind,
        workOrderId: op.workOrderId,
        ...by,
        detail: { operation: op },
        answered,
      });
    const fromBatch = { actorId: actor.id, deviceId: batch.deviceId };
    const fresh: Operation[] = [];
    for (const op of byId.values()) {
      const author = onFile.get(op.id) ?? heldBefore.get(op.id)?.authorId;
      if (author === undefined) fresh.push(op);
      else if (author !== actor.id)
        refuse(op, `Operation id ${op.id} is already used by another user's operation. Discard this entry with a reason.`, fromBatch);
      else if (onFile.has(op.id)) duplicates.push(op.id);
      else pending.set(op.id, heldBefore.get(op.id)!.reason);
    }

    const ordered = sortByStamp(fresh);
    // Operations held by earlier batches for a record this batch brings (and for what those bring in turn).
    const looked = new Set<string>();
    const seen = new Set<string>();
    const filed = await heldForRecordsOf(trx, actor.shopId, ordered, looked, seen, waitingForBatch);
    const fromFile = new Set(filed.map((h) => h.op.id));
    const jobIds = new Set([
      ...ordered.map((o) => o.workOrderId),
      ...filed.map((h) => h.op.workOrderId),
      ...malformed.flatMap((m) => (m.workOrderId ? [m.workOrderId] : [])),
    ]);
    // the stages' standing approvals are read by the rules on withdrawals and on work recorded after an approval
    const toDecide = [...ordered, ...filed.map((h) => h.op)];
    const readsApprovals = toDecide.some((o) => o.kind === "entry.withdrawn" || recordedStep(o) !== null);
    const jobs = await loadWorkOrderFacts(trx, actor.shopId, [...jobIds], { approvals: readsApprovals });
    const state = await loadMergeState(trx, toDecide);

    const kept: KeptOperation[] = [];
    const applied: string[] = [];
    const refusedHeld: string[] = [];
    let waiting: HeldOperation[] = [];
    const decideAs = (h: Candidate): Decision =>
      decideOperation(h.op, {
        actor: { id: h.op.authorId, shopId: actor.shopId, role: h.authorRole },
        batchDeviceId: h.op.deviceId,
        cursor: h.cursor,
        nowMs: h.receivedAtMs,
        job: jobs.get(h.op.workOrderId),
        state,
      });
    /** Keeps, refuses or holds an operation as decided; a held one from file is marked applied or refused. */
    const settle = (h: Candidate, decision: Decision, by = { actorId: h.op.authorId, deviceId: h.op.deviceId }) => {
      const wasFiled = fromFile.has(h.op.id);
      if (decision.outcome === "refuse") {
        refuse(h.op, decision.reason, by, byId.has(h.op.id));
        if (wasFiled) refusedHeld.push(h.op.id);
      } else if (decision.outcome === "wait") {
        waiting.push({ ...h, target: decision.target, reason: decision.reason });
      } else {
        kept.push({ op: h.op, decision });
        noteAccepted(h.op, state, jobs.get(h.op.workOrderId)?.number);
        const entry = state.entries.get(h.op.id);
        if (entry && decision.outcome === "flag") entry.flaggedOpen = true;
        if (wasFiled) applied.push(h.op.id);
      }
    };

    // The new operations and the held ones they bring, in one pass in stamp order.
    const pass = sortByStamp([
      ...ordered.map((op) => ({ id: op.id, stamp: op.stamp, h: { op, authorRole: actor.role, cursor, receivedAtMs: nowMs } })),
      ...filed.map((h) => ({ id: h.op.id, stamp: h.op.stamp, h })),
    ]);
    for (const { h } of pass) {
      if (fromFile.has(h.op.id)) settle(h, decideAs(h));
      else {
        const decision = decideOperation(h.op, {
          actor,
          batchDeviceId: batch.deviceId,
          cursor,
          nowMs,
          job: jobs.get(h.op.workOrderId),
          state,
        });
        settle(h, decision, fromBatch);
      }
    }

    // Those whose record turned up later in the pass (a stamp out of causal order): round after round.
    for (;;) {
      const ready = waiting.filter((w) => targetPresent(w.target, state));
      if (!ready.length) break;
      waiting = waiting.filter((w) => !targetPresent(w.target, state));
      for (const { h } of sortByStamp(ready.map((h) => ({ id: h.op.id, stamp: h.op.stamp, h })))) settle(h, decideAs(h));
    }

    // Parts fitted draw from stock; one the shelf cannot cover is kept and flagged (never refused).
    // A fit withdrawn never left the shelf: one on file puts back what it drew (first, so the batch's
    // own fits find it there), and one made and withdrawn within this batch draws nothing.
    const fitWithdrawals = kept.flatMap((k) =>
      k.op.kind === "entry.withdrawn" && state.entries.get(k.op.payload.operationId)?.kind === "part.fitted"
        ? [{ fitOperationId: k.op.payload.operationId, reason: k.op.payload.reason, by: k.op.authorId }]
        : [],
    );
    const keptIds = new Set(kept.map((k) => k.op.id));
    const withdrawnHere = new Set(fitWithdrawals.filter((w) => keptIds.has(w.fitOperationId)).map((w) => w.fitOperationId));
    await returnWithdrawnDraws(
      trx,
      actor.shopId,
      fitWithdrawals.filter((w) => !withdrawnHere.has(w.fitOperationId)),
    );
    const draws = await planStockDraws(
      trx,
      actor.shopId,
      kept.flatMap((k) => (k.op.kind === "part.fitted" && !withdrawnHere.has(k.op.id) ? [k.op] : [])),
    );
    for (const k of kept) {
      const stockReason = draws.get(k.op.id)?.reason ?? null;
      const reason = withStockReason(k.decision.outcome === "flag" ? k.decision.reason : null, stockReason);
      if (reason) k.decision = { outcome: "flag", reason };
    }
    // every kept operation is written (an id taken meanwhile by another shop fails the whole batch)
    await writeKept(trx, actor.shopId, kept, jobs, state);
    await writeStockDraws(trx, actor.shopId, [...draws.values()]);
    await applyFirstOverrides(
      trx,
      kept.flatMap((k) => (k.op.kind === "timer.overridden" ? [k.op.payload.timerId] : [])),
    );
    await holdOperations(
      trx,
      actor.shopId,
      waiting.filter((w) => !fromFile.has(w.op.id)),
    );
    await resolveHeld(trx, applied, "applied");
    await resolveHeld(trx, refusedHeld, "refused");

    // Accepted operations were audited by writeKept; refusals are audited here (once per reason).
    for (const m of malformed) {
      refused.push({
        id: m.id,
        reason: m.reason,
        kind: m.kind ?? "unreadable",
        workOrderId: m.workOrderId,
        ...fromBatch,
        detail: { operation: m.copy, malformed: true },
        answered: true,
      });
    }
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
          actorId: r.actorId,
          deviceId: r.deviceId,
          action: `sync.${r.kind}`,
          entity: "operation",
          entityId: r.id,
          // Only a job of this shop is linked; the named id stays in the detail.
          workOrderId: r.workOrderId && jobs.get(r.workOrderId)?.shopId === actor.shopId ? r.workOrderId : null,
          outcome: "refused",
          reason: r.reason,
          detail: r.detail,
        })),
    );

    const stored = kept.filter((k) => byId.has(k.op.id));
    for (const k of stored) pending.delete(k.op.id);
    for (const w of waiting) if (byId.has(w.op.id)) pending.set(w.op.id, w.reason);
    for (const r of refused) if (r.answered) pending.delete(r.id);

    const page = await changesSince(trx, actor.shopId, { deviceId: batch.deviceId, authorId: actor.id }, cursor);
    return {
      accepted: stored.map((k) => k.op.id),
      duplicates,
      refused: refused.filter((r) => r.answered).map(({ id, reason }) => ({ id, reason })),
      flagged: stored.flatMap((k) => (k.decision.outcome === "flag" ? [{ id: k.op.id, reason: k.decision.reason }] : [])),
      pending: [...pending].map(([id, reason]) => ({ id, reason })),
      changes: page.changes,
      cursor: page.cursor,
      more: page.more,
    };
  });
}
