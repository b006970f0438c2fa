import "server-only";
import { notWithdrawn } from "../records/withdrawn";
import { sql, type Kysely } from "kysely";
import { plainCode } from "@/lib/sync/parts";
import type { Database } from "../schema";

// "Which bikes got batch X?" across the stock's whole life: received (the delivery), put aside for
// a job, let go, and fitted — fitted from stock (the draw names the part fitted) or recorded
// without stock (matched as typed, any case). Serial numbers are found the same way.

export type StockEvent = "received" | "reserved" | "released" | "returned" | "fitted";

export interface StockSearchRow {
  event: StockEvent;
  at: Date;
  partNumber: string;
  description: string;
  batch: string | null;
  serial: string | null;
  quantity: number;
  location: string | null;
  supplier: string | null;
  workOrderId: string | null;
  workOrderNumber: number | null;
  bikeId: string | null;
  tagCode: string | null;
  make: string | null;
  model: string | null;
  customerName: string | null;
}

/** Every event of the batch or serial number `code` in the shop, oldest first. */
export async function searchStockByCode(db: Kysely<Database>, shopId: string, code: string): Promise<StockSearchRow[]> {
  const key = plainCode(code);
  const lower = code.trim().toLowerCase();
  const r = await sql<StockSearchRow>`
    WITH lots AS (
      SELECT l.id, l.location, l.batch, l.serial, i.part_number, i.description, d.supplier
      FROM stock_lots l
      JOIN stock_items i ON i.id = l.item_id
      JOIN stock_deliveries d ON d.id = l.delivery_id
      WHERE l.shop_id = ${shopId}::uuid AND (l.batch_key = ${key} OR l.serial_key = ${key})
    ),
    moves AS (
      SELECT m.kind, m.recorded_at AS at, m.quantity, m.work_order_id, m.part_fitted_id, lots.*
      FROM stock_movements m JOIN lots ON lots.id = m.lot_id
    ),
    fitted AS (
      SELECT p.id, p.fitted_at, p.part_number, p.description, p.batch, p.serial, p.quantity, p.supplier, p.work_order_id
      FROM parts_fitted p
      WHERE p.shop_id = ${shopId}::uuid
        AND ((p.batch IS NOT NULL AND lower(p.batch) = ${lower}) OR (p.serial IS NOT NULL AND lower(p.serial) = ${lower}))
        AND ${notWithdrawn("p.operation_id")}
      UNION
      SELECT p.id, p.fitted_at, p.part_number, p.description, p.batch, p.serial, p.quantity, p.supplier, p.work_order_id
      FROM moves JOIN parts_fitted p ON p.id = moves.part_fitted_id
      WHERE moves.kind = 'drawn' AND ${notWithdrawn("p.operation_id")}
    ),
    events AS (
      SELECT m.kind AS event, m.at, m.part_number, m.description, m.batch, m.serial, m.quantity, m.location, m.supplier, m.work_order_id
      FROM moves m WHERE m.kind IN ('received', 'reserved', 'released', 'returned')
      UNION ALL
      SELECT 'fitted', f.fitted_at, f.part_number, f.description, f.batch, f.serial, f.quantity, NULL, NULLIF(f.supplier, ''), f.work_order_id
      FROM fitted f
    )
    SELECT e.event, e.at, e.part_number AS "partNumber", e.description, e.batch, e.serial, e.quantity, e.location, e.supplier,
      w.id AS "workOrderId", w.number AS "workOrderNumber", b.id AS "bikeId", b.tag_code AS "tagCode", b.make, b.model,
      c.name AS "customerName"
    FROM events e
    LEFT JOIN work_orders w ON w.id = e.work_order_id
    LEFT JOIN bikes b ON b.id = w.bike_id
    LEFT JOIN customers c ON c.id = b.customer_id
    ORDER BY e.at, e.event
    LIMIT 2000
  `.execute(db);
  return r.rows;
}
