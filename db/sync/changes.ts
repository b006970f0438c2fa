import "server-only";
import { sql, type Kysely, type Transaction } from "kysely";
import { serverStamp, type Change } from "@/lib/sync/changes";
import { SYNC_LIMITS } from "@/lib/sync/operations";
import { CLOSED_STATUSES } from "@/lib/work-orders/status";
import type { Database } from "../schema";

// The change feed: operations and review decisions of a shop after a cursor, in seq order.
// Both share one sequence (operations.seq; review_decisions.change_seq draws from it), and every
// writer takes the shop's sync lock before drawing numbers, so paging by seq never skips a row.
// Scope: the shop's work orders that are not closed (handed over / cancelled).

type Db = Kysely<Database> | Transaction<Database>;

interface ChangePage {
  changes: Change[];
  cursor: string;
  more: boolean;
}

/** The highest sequence number in the shop (operations and decisions), 0 when there is none. */
export async function shopCursor(db: Db, shopId: string): Promise<number> {
  const r = await sql<{ seq: string | number | null }>`
    SELECT GREATEST(
      (SELECT max(seq) FROM operations WHERE shop_id = ${shopId}::uuid),
      (SELECT d.change_seq FROM review_decisions d
         JOIN sign_offs so ON so.id = d.sign_off_id JOIN work_orders w ON w.id = so.work_order_id
         WHERE w.shop_id = ${shopId}::uuid ORDER BY d.change_seq DESC LIMIT 1)
    ) AS seq
  `.execute(db);
  return Number(r.rows[0]?.seq ?? 0);
}

/**
 * Changes in the shop after `cursor` (null: from the start), leaving out the operations the asking
 * tablet already has: those its own user recorded on that device (`asking`). Another person's work
 * on the same tablet is not left out: each person has their own store on a tablet, so theirs does
 * not hold it. At most `limit` entries; `more` says whether others wait, and `cursor` is where to
 * go on from.
 */
export async function changesSince(
  db: Db,
  shopId: string,
  asking: { deviceId: string; authorId: string } | null,
  cursor: number | null,
  limit: number = SYNC_LIMITS.maxChanges,
): Promise<ChangePage> {
  const after = cursor ?? 0;
  const [ops, decisions, top] = await Promise.all([
    sql<{ seq: string | number; id: string; work_order_id: string; stamp: string }>`
      SELECT o.seq, o.id, o.work_order_id, o.stamp
      FROM operations o JOIN work_orders w ON w.id = o.work_order_id
      WHERE o.shop_id = ${shopId}::uuid AND o.seq > ${after}
        AND NOT ((o.device_id = ${asking?.deviceId ?? null}::text AND o.author_id = ${asking?.authorId ?? null}::uuid) IS TRUE)
        AND w.status <> ALL(${[...CLOSED_STATUSES]}::text[])
      ORDER BY o.seq
      LIMIT ${limit + 1}
    `.execute(db),
    sql<{ change_seq: string | number; id: string; work_order_id: string; decided_at: Date }>`
      SELECT d.change_seq, d.id, so.work_order_id, d.decided_at
      FROM review_decisions d
      JOIN sign_offs so ON so.id = d.sign_off_id
      JOIN work_orders w ON w.id = so.work_order_id
      WHERE w.shop_id = ${shopId}::uuid AND d.change_seq > ${after} AND w.status <> ALL(${[...CLOSED_STATUSES]}::text[])
      ORDER BY d.change_seq
      LIMIT ${limit + 1}
    `.execute(db),
    shopCursor(db, shopId),
  ]);

  const all: Change[] = [
    ...ops.rows.map((o): Change => ({ type: "operation", seq: String(o.seq), id: o.id, workOrderId: o.work_order_id, stamp: o.stamp })),
    ...decisions.rows.map((d): Change => ({
      type: "review",
      seq: String(d.change_seq),
      id: d.id,
      workOrderId: d.work_order_id,
      stamp: serverStamp(d.decided_at.getTime()),
    })),
  ].sort((a, b) => Number(a.seq) - Number(b.seq));

  if (all.length > limit) {
    const page = all.slice(0, limit);
    return { changes: page, cursor: page[page.length - 1].seq, more: true };
  }
  return { changes: all, cursor: String(Math.max(top, after)), more: false };
}
