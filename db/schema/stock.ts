import type { Generated } from "kysely";
import type { DefaultTimestamp } from "./columns";

// Stock: items, low-stock levels, deliveries, lots with their balances, movements (migration 2026_12_06_100).

export type StockMovementKind = "received" | "reserved" | "released" | "drawn" | "returned";

interface StockItemsTable {
  id: Generated<string>;
  shop_id: string;
  part_number: string;
  part_key: string;
  description: Generated<string>;
  created_by: string;
  created_at: DefaultTimestamp;
}

interface StockLevelsTable {
  id: Generated<string>;
  shop_id: string;
  item_id: string;
  low_at: number;
  set_by: string;
  set_at: DefaultTimestamp;
}

interface StockDeliveriesTable {
  id: Generated<string>;
  shop_id: string;
  supplier: string;
  reference: Generated<string>;
  received_by: string;
  received_at: DefaultTimestamp;
}

interface StockLotsTable {
  id: Generated<string>;
  shop_id: string;
  item_id: string;
  delivery_id: string;
  location: string;
  batch: string | null;
  batch_key: string | null;
  serial: string | null;
  serial_key: string | null;
  received_qty: number;
  /** CHECK (on_hand >= 0). */
  on_hand: number;
  reserved: Generated<number>;
  received_at: DefaultTimestamp;
}

interface StockMovementsTable {
  id: Generated<string>;
  shop_id: string;
  item_id: string;
  lot_id: string | null;
  kind: StockMovementKind;
  quantity: number;
  reserved_used: Generated<number>;
  short: Generated<number>;
  work_order_id: string | null;
  part_fitted_id: string | null;
  releases_id: string | null;
  reason: string | null;
  recorded_by: string;
  recorded_at: DefaultTimestamp;
}

export interface StockTables {
  stock_items: StockItemsTable;
  stock_levels: StockLevelsTable;
  stock_deliveries: StockDeliveriesTable;
  stock_lots: StockLotsTable;
  stock_movements: StockMovementsTable;
}
