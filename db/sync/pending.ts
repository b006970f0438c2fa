import "server-only";
import { sql, type Selectable, type Transaction } from "kysely";
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

type HeldRow = Pick<
  Selectable<Database["sync_pending_operations"]>,
  "id" | "operation" | "author_role" | "batch_cursor" | "received_at" | "target_kind" | "target_id" | "reason"
>;

/** A held row as the merge decides it (stored after the wire format passed it); null for a row a later format no longer reads (it stays held). */
function heldOperation(r: HeldRow): HeldOperation | null {
  const parsed = operationSchema.safeParse(r.operation);
  if (!parsed.success) return null;
  return {
    op: parsed.data,
    authorRole: r.author_role,
    cursor: r.batch_cursor === null ? null : Number(r.batch_cursor),
    receivedAtMs: r.received_at.getTime(),
    target: { kind: r.target_kind as Target["kind"], id: r.target_id },
    reason: r.reason,
  };
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
  return rows.flatMap((r) => {
    const h = skip.has(r.id) ? null : heldOperation(r);
    return h ? [h] : [];
  });
}

/** What the merge looks up first about a batch's ids, in one statement (`batchOnFile`). */
export interface BatchOnFile {
  /** Operations on file among the ids, with their author. */
  onFile: Map<string, string>;
  /** Held operations among the ids (not yet applied, refused or discarded): author and reason. */
  held: Map<string, { authorId: string; reason: string }>;
  /** Held operations of the shop waiting for one of the targets. */
  waiting: HeldOperation[];
}

/**
 * `existingOperations`, `heldOnFile` and `heldForTargets` of a batch in one round trip, each list
 * of ids sent and read as uuid[] once: a 10,000-operation batch cost three statements and three
 * conversions of the same 10,000 ids before. `targets` are the records the batch's operations
 * would create beyond their own ids (timers, clocks); held operations waiting for the ids
 * themselves come too.
 */
export async function batchOnFile(trx: Tx, shopId: string, ids: readonly string[], targets: readonly string[]): Promise<BatchOnFile> {
  const out: BatchOnFile = { onFile: new Map(), held: new Map(), waiting: [] };
  if (!ids.length) return out;
  const r = await sql<HeldRow & { what: "file" | "held" | "waiting"; author_id: string }>`
    WITH ids AS (SELECT ${[...ids]}::uuid[] AS a), targets AS (SELECT ${[...targets]}::uuid[] AS a)
    SELECT 'file' AS what, o.id, o.author_id, NULL::text AS reason, NULL::jsonb AS operation, NULL::text AS author_role,
      NULL::bigint AS batch_cursor, NULL::timestamptz AS received_at, NULL::text AS target_kind, NULL::uuid AS target_id
    FROM operations o WHERE o.id = ANY((SELECT a FROM ids)::uuid[])
    UNION ALL
    SELECT 'held', p.id, p.author_id, p.reason, NULL, NULL, NULL, NULL, NULL, NULL
    FROM sync_pending_operations p WHERE p.id = ANY((SELECT a FROM ids)::uuid[]) AND p.resolved_at IS NULL
    UNION ALL
    SELECT 'waiting', p.id, p.author_id, p.reason, p.operation, p.author_role, p.batch_cursor, p.received_at, p.target_kind, p.target_id
    FROM sync_pending_operations p
    WHERE p.shop_id = ${shopId}::uuid AND p.resolved_at IS NULL
      AND (p.target_id = ANY((SELECT a FROM ids)::uuid[]) OR p.target_id = ANY((SELECT a FROM targets)::uuid[]))
  `.execute(trx);
  for (const row of r.rows) {
    if (row.what === "file") out.onFile.set(row.id, row.author_id);
    else if (row.what === "held") out.held.set(row.id, { authorId: row.author_id, reason: row.reason });
    else {
      const h = heldOperation(row);
      if (h) out.waiting.push(h);
    }
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
