import "server-only";
import { notWithdrawn } from "../records/withdrawn";
import { sql, type Kysely } from "kysely";
import type { Database } from "../schema";
import { outstandingReservations } from "./balances";

// What the stock page shows: lots on the shelf, what is put aside for which job, the low-stock
// list, and fits the shelf could not cover.

export interface LotOnHand {
  id: string;
  partNumber: string;
  description: string;
  location: string;
  batch: string | null;
  serial: string | null;
  onHand: number;
  reserved: number;
  supplier: string;
  receivedAt: Date;
}

/** Lots with something on the shelf or put aside, by part number then oldest first. */
export async function lotsOnHand(db: Kysely<Database>, shopId: string): Promise<LotOnHand[]> {
  return db
    .selectFrom("stock_lots as l")
    .innerJoin("stock_items as i", "i.id", "l.item_id")
    .innerJoin("stock_deliveries as d", "d.id", "l.delivery_id")
    .select([
      "l.id",
      "i.part_number as partNumber",
      "i.description",
      "l.location",
      "l.batch",
      "l.serial",
      "l.on_hand as onHand",
      "l.reserved",
      "d.supplier",
      "l.received_at as receivedAt",
    ])
    .where("l.shop_id", "=", shopId)
    .where((eb) => eb.or([eb("l.on_hand", ">", 0), eb("l.reserved", ">", 0)]))
    .orderBy("i.part_key")
    .orderBy("l.received_at")
    .orderBy("l.id")
    .limit(1000)
    .execute();
}

export interface LowStockRow {
  itemId: string;
  partNumber: string;
  description: string;
  onHand: number;
  reserved: number;
  free: number;
  lowAt: number;
}

/** Items whose free stock (on the shelf less what is put aside) is at or below their low-stock level. */
export async function lowStock(db: Kysely<Database>, shopId: string): Promise<LowStockRow[]> {
  const r = await sql<LowStockRow>`
    WITH level AS (
      SELECT DISTINCT ON (item_id) item_id, low_at FROM stock_levels WHERE shop_id = ${shopId}::uuid ORDER BY item_id, set_at DESC, id DESC
    ),
    totals AS (
      SELECT item_id, sum(on_hand)::int AS on_hand, sum(reserved)::int AS reserved FROM stock_lots WHERE shop_id = ${shopId}::uuid GROUP BY item_id
    )
    SELECT i.id AS "itemId", i.part_number AS "partNumber", i.description, COALESCE(t.on_hand, 0) AS "onHand",
      COALESCE(t.reserved, 0) AS reserved, GREATEST(0, COALESCE(t.on_hand, 0) - COALESCE(t.reserved, 0)) AS free, level.low_at AS "lowAt"
    FROM stock_items i
    JOIN level ON level.item_id = i.id
    LEFT JOIN totals t ON t.item_id = i.id
    WHERE i.shop_id = ${shopId}::uuid AND GREATEST(0, COALESCE(t.on_hand, 0) - COALESCE(t.reserved, 0)) <= level.low_at
    ORDER BY GREATEST(0, COALESCE(t.on_hand, 0) - COALESCE(t.reserved, 0)) - level.low_at, i.part_key
  `.execute(db);
  return r.rows;
}

export interface ReservationRow {
  id: string;
  lotId: string;
  partNumber: string;
  batch: string | null;
  serial: string | null;
  location: string;
  quantity: number;
  /** Still put aside (less what the job's fits used and what was let go). */
  outstanding: number;
  workOrderId: string;
  workOrderNumber: number;
  reservedAt: Date;
}

/** Reservations not let go, with what is still put aside; those fully used by fits are left out. */
export async function openReservations(db: Kysely<Database>, shopId: string): Promise<ReservationRow[]> {
  const rows = await db
    .selectFrom("stock_movements as m")
    .innerJoin("stock_lots as l", "l.id", "m.lot_id")
    .innerJoin("stock_items as i", "i.id", "m.item_id")
    .innerJoin("work_orders as w", "w.id", "m.work_order_id")
    .leftJoin("stock_movements as r", "r.releases_id", "m.id")
    .select([
      "m.id",
      "l.id as lotId",
      "i.part_number as partNumber",
      "l.batch",
      "l.serial",
      "l.location",
      "m.quantity",
      "w.id as workOrderId",
      "w.number as workOrderNumber",
      "m.recorded_at as reservedAt",
    ])
    .where("m.shop_id", "=", shopId)
    .where("m.kind", "=", "reserved")
    .where("r.id", "is", null)
    .where("l.reserved", ">", 0)
    .orderBy("m.recorded_at")
    .execute();
  const held = await outstandingReservations(db, [...new Set(rows.map((r) => r.lotId))]);
  // Several reservations of one lot for one job share what is left, oldest first.
  const left = new Map<string, number>();
  const out: ReservationRow[] = [];
  for (const r of rows) {
    const k = `${r.lotId}|${r.workOrderId}`;
    const avail = left.get(k) ?? held.get(r.lotId)?.get(r.workOrderId!) ?? 0;
    const outstanding = Math.min(r.quantity, avail);
    left.set(k, avail - outstanding);
    if (outstanding > 0) out.push({ ...r, workOrderId: r.workOrderId!, outstanding });
  }
  return out;
}

export interface ShortfallRow {
  id: string;
  partNumber: string;
  batch: string | null;
  serial: string | null;
  fitted: number;
  short: number;
  workOrderId: string;
  workOrderNumber: number;
  fittedBy: string | null;
  recordedAt: Date;
}

/** Fits the shelf could not cover (kept and flagged at the merge), newest first. */
export async function stockShortfalls(db: Kysely<Database>, shopId: string): Promise<ShortfallRow[]> {
  return (
    db
      .selectFrom("stock_movements as m")
      .innerJoin("parts_fitted as p", "p.id", "m.part_fitted_id")
      .innerJoin("work_orders as w", "w.id", "m.work_order_id")
      .leftJoin("users as u", "u.id", "m.recorded_by")
      .select([
        "m.id",
        "p.part_number as partNumber",
        "p.batch",
        "p.serial",
        "p.quantity as fitted",
        "m.short",
        "w.id as workOrderId",
        "w.number as workOrderNumber",
        "u.name as fittedBy",
        "m.recorded_at as recordedAt",
      ])
      .where("m.shop_id", "=", shopId)
      .where("m.short", ">", 0)
      // a fit withdrawn at the bench was a mistake: nothing was short
      .where(notWithdrawn("p.operation_id"))
      .orderBy("m.recorded_at", "desc")
      .limit(200)
      .execute()
  );
}
