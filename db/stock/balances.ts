import "server-only";
import { sql, type Kysely, type Transaction } from "kysely";
import type { LotBalance } from "@/lib/stock/draw";
import type { Database } from "../schema";

// The balances of lots as the draw planner needs them, read under a row lock: on hand, put aside in
// all, and what is still put aside for each work order (reserved − released − used by its fits,
// plus what a withdrawn fit put back).

type Db = Kysely<Database> | Transaction<Database>;

/**
 * Locks these lots' rows until the transaction ends, in id order (two transactions locking some of
 * the same lots never wait on each other in a circle). Every writer of a lot's balance takes it first.
 */
export async function lockLots(trx: Transaction<Database>, lotIds: readonly string[]): Promise<void> {
  const ids = [...new Set(lotIds)].sort();
  if (ids.length) await trx.selectFrom("stock_lots").select("id").where("id", "in", ids).orderBy("id").forUpdate().execute();
}

/** Outstanding reservations per lot and work order: lot id → (work order id → quantity). */
export async function outstandingReservations(db: Db, lotIds: readonly string[]): Promise<Map<string, Map<string, number>>> {
  const out = new Map<string, Map<string, number>>();
  if (!lotIds.length) return out;
  const rows = await sql<{ lot_id: string; work_order_id: string; outstanding: number }>`
    SELECT lot_id, work_order_id,
      sum(CASE kind WHEN 'reserved' THEN quantity WHEN 'released' THEN -quantity WHEN 'drawn' THEN -reserved_used
        WHEN 'returned' THEN reserved_used ELSE 0 END)::int AS outstanding
    FROM stock_movements
    WHERE lot_id = ANY(${[...lotIds]}::uuid[]) AND work_order_id IS NOT NULL
    GROUP BY lot_id, work_order_id
  `.execute(db);
  for (const r of rows.rows) {
    if (r.outstanding <= 0) continue;
    if (!out.has(r.lot_id)) out.set(r.lot_id, new Map());
    out.get(r.lot_id)!.set(r.work_order_id, r.outstanding);
  }
  return out;
}

/** Lots with their balances (locked FOR UPDATE until the transaction ends), oldest first. */
export async function lockedLots(
  trx: Transaction<Database>,
  where: { shopId: string; itemIds: readonly string[] },
): Promise<Array<LotBalance & { itemId: string; batchKey: string | null; serialKey: string | null }>> {
  if (!where.itemIds.length) return [];
  const lots = await trx
    .selectFrom("stock_lots")
    .select([
      "id",
      "item_id as itemId",
      "location",
      "on_hand as onHand",
      "reserved",
      "batch_key as batchKey",
      "serial_key as serialKey",
      "received_at as receivedAt",
    ])
    .where("shop_id", "=", where.shopId)
    .where("item_id", "in", [...where.itemIds])
    // locked in id order, as lockLots locks (no two writers wait on each other in a circle); oldest first below
    .orderBy("id")
    .forUpdate()
    .execute();
  lots.sort((a, b) => a.receivedAt.getTime() - b.receivedAt.getTime() || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const held = await outstandingReservations(
    trx,
    lots.map((l) => l.id),
  );
  return lots.map(({ receivedAt: _receivedAt, ...l }) => ({ ...l, reservedFor: held.get(l.id) ?? new Map() }));
}
