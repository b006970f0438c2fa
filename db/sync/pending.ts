import "server-only";
import { sql, type Transaction } from "kysely";
import type { Role } from "@/lib/auth/roles";
import type { Target } from "@/lib/sync/merge-rules";
import { operationSchema, type Operation } from "@/lib/sync/operations";
import type { Database } from "../schema";

// Operations held until the record they act on arrives (table sync_pending_operations, migration
// 040). The merge holds them, finds them again when their record arrives, and marks what became
// of them; rows are never deleted.

type Tx = Transaction<Database>;

/** A held operation and what its decision needs: who sent it, with which role, cursor and server time. */
export interface HeldOperation {
  op: Operation;
  authorRole: Role;
  cursor: number | null;
  receivedAtMs: number;
  target: Target;
  reason: string;
}

/** Held operations among `ids` (not yet applied, refused or discarded): author and reason. */
export async function heldOnFile(trx: Tx, ids: readonly string[]): Promise<Map<string, { authorId: string; reason: string }>> {
  if (!ids.length) return new Map();
  const rows = await trx
    .selectFrom("sync_pending_operations")
    .select(["id", "author_id", "reason"])
    .where("id", "=", sql<string>`ANY(${[...ids]}::uuid[])`)
    .where("resolved_at", "is", null)
    .execute();
  return new Map(rows.map((r) => [r.id, { authorId: r.author_id, reason: r.reason }]));
}

/** Held operations of the shop waiting for one of `targetIds`, leaving out `skip`. */
export async function heldForTargets(
  trx: Tx,
  shopId: string,
  targetIds: Iterable<string>,
  skip: ReadonlySet<string>,
): Promise<HeldOperation[]> {
  const targets = [...targetIds];
  if (!targets.length) return [];
  const rows = await trx
    .selectFrom("sync_pending_operations")
    .select(["id", "operation", "author_role", "batch_cursor", "received_at", "target_kind", "target_id", "reason"])
    .where("shop_id", "=", shopId)
    .where("target_id", "=", sql<string>`ANY(${targets}::uuid[])`)
    .where("resolved_at", "is", null)
    .execute();
  const out: HeldOperation[] = [];
  for (const r of rows) {
    if (skip.has(r.id)) continue;
    // Stored after the wire format passed it; a row a later format no longer reads stays held.
    const parsed = operationSchema.safeParse(r.operation);
    if (!parsed.success) continue;
    out.push({
      op: parsed.data,
      authorRole: r.author_role,
      cursor: r.batch_cursor === null ? null : Number(r.batch_cursor),
      receivedAtMs: r.received_at.getTime(),
      target: { kind: r.target_kind as Target["kind"], id: r.target_id },
      reason: r.reason,
    });
  }
  return out;
}

/** Holds operations (one statement; an id already held is left as it is). */
export async function holdOperations(trx: Tx, shopId: string, held: readonly HeldOperation[]): Promise<void> {
  if (!held.length) return;
  await trx
    .insertInto("sync_pending_operations")
    .values(
      held.map((h) => ({
        id: h.op.id,
        shop_id: shopId,
        work_order_id: h.op.workOrderId,
        author_id: h.op.authorId,
        author_role: h.authorRole,
        device_id: h.op.deviceId,
        stamp: h.op.stamp,
        operation: JSON.stringify(h.op),
        target_kind: h.target.kind,
        target_id: h.target.id,
        reason: h.reason,
        batch_cursor: h.cursor === null ? null : String(h.cursor),
        received_at: new Date(h.receivedAtMs),
      })),
    )
    .onConflict((oc) => oc.column("id").doNothing())
    .execute();
}

/** Marks held operations as applied, refused or discarded. */
export async function resolveHeld(trx: Tx, ids: readonly string[], resolution: "applied" | "refused" | "discarded"): Promise<void> {
  if (!ids.length) return;
  await trx
    .updateTable("sync_pending_operations")
    .set({ resolved_at: sql`now()`, resolution })
    .where("id", "=", sql<string>`ANY(${[...ids]}::uuid[])`)
    .where("resolved_at", "is", null)
    .execute();
}
