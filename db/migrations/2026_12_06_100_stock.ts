import { sql, type Kysely } from "kysely";

// Stock: parts on the shelf, what came in, what is put aside for a job, what the bench drew.
//
// - stock_items: one per part number of the shop (compared as `part_key`: case, spaces and
//   punctuation ignored). Never changed.
// - stock_levels: the low-stock level of an item; the latest row counts. Append-only.
// - stock_deliveries: one delivery from a supplier. Append-only.
// - stock_lots: what one delivery line brought (a batch, or one serial-numbered part) and where it
//   was put away, with its running balance `on_hand` and `reserved`, kept in the same transaction
//   as the movement that changes them. CHECK (on_hand >= 0): PostgreSQL itself refuses negative
//   stock. Only the two balances may change (a trigger refuses anything else, and deletes).
//   A serial number is on file once per part (unique index).
// - stock_movements: the record — received, reserved (to a work order), released (pointing at the
//   reservation, with a reason), drawn (at a fit, pointing at the part fitted; `short` counts what
//   the shelf could not cover). Append-only.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE stock_items (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      part_number text NOT NULL CHECK (length(part_number) BETWEEN 1 AND 60),
      part_key text NOT NULL CHECK (length(part_key) >= 1),
      description text NOT NULL DEFAULT '' CHECK (length(description) <= 200),
      created_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (shop_id, part_key)
    );
    CREATE TRIGGER stock_items_append_only BEFORE UPDATE OR DELETE ON stock_items
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE stock_levels (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      item_id uuid NOT NULL REFERENCES stock_items(id),
      low_at integer NOT NULL CHECK (low_at BETWEEN 0 AND 100000),
      set_by uuid NOT NULL REFERENCES users(id),
      set_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX stock_levels_item_idx ON stock_levels (item_id, set_at DESC, id);
    CREATE TRIGGER stock_levels_append_only BEFORE UPDATE OR DELETE ON stock_levels
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE stock_deliveries (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      supplier text NOT NULL CHECK (length(supplier) BETWEEN 1 AND 120),
      reference text NOT NULL DEFAULT '' CHECK (length(reference) <= 80),
      received_by uuid NOT NULL REFERENCES users(id),
      received_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TRIGGER stock_deliveries_append_only BEFORE UPDATE OR DELETE ON stock_deliveries
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE stock_lots (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      item_id uuid NOT NULL REFERENCES stock_items(id),
      delivery_id uuid NOT NULL REFERENCES stock_deliveries(id),
      location text NOT NULL CHECK (length(location) BETWEEN 1 AND 60),
      batch text CHECK (length(batch) BETWEEN 1 AND 80),
      batch_key text,
      serial text CHECK (length(serial) BETWEEN 1 AND 80),
      serial_key text,
      received_qty integer NOT NULL CHECK (received_qty BETWEEN 1 AND 100000),
      on_hand integer NOT NULL CHECK (on_hand >= 0),
      reserved integer NOT NULL DEFAULT 0 CHECK (reserved >= 0),
      received_at timestamptz NOT NULL DEFAULT now(),
      CHECK (batch IS NOT NULL OR serial IS NOT NULL),
      CHECK ((batch IS NULL) = (batch_key IS NULL) AND (serial IS NULL) = (serial_key IS NULL)),
      CHECK (serial IS NULL OR received_qty = 1)
    );
    CREATE UNIQUE INDEX stock_lots_serial_once ON stock_lots (item_id, serial_key) WHERE serial_key IS NOT NULL;
    CREATE INDEX stock_lots_item_idx ON stock_lots (item_id, received_at, id);
    CREATE INDEX stock_lots_batch_idx ON stock_lots (shop_id, batch_key) WHERE batch_key IS NOT NULL;
    CREATE INDEX stock_lots_serial_idx ON stock_lots (shop_id, serial_key) WHERE serial_key IS NOT NULL;
    CREATE INDEX stock_lots_on_hand_idx ON stock_lots (shop_id, item_id) WHERE on_hand > 0;

    CREATE FUNCTION benchtag_stock_lot_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        RAISE EXCEPTION 'stock_lots keeps every lot: DELETE refused';
      END IF;
      IF (NEW.id, NEW.shop_id, NEW.item_id, NEW.delivery_id, NEW.location, NEW.batch, NEW.batch_key, NEW.serial, NEW.serial_key,
          NEW.received_qty, NEW.received_at)
         IS DISTINCT FROM
         (OLD.id, OLD.shop_id, OLD.item_id, OLD.delivery_id, OLD.location, OLD.batch, OLD.batch_key, OLD.serial, OLD.serial_key,
          OLD.received_qty, OLD.received_at) THEN
        RAISE EXCEPTION 'stock_lots: only the balances (on_hand, reserved) change';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER stock_lots_guard BEFORE UPDATE OR DELETE ON stock_lots
      FOR EACH ROW EXECUTE FUNCTION benchtag_stock_lot_guard();

    CREATE TABLE stock_movements (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      item_id uuid NOT NULL REFERENCES stock_items(id),
      lot_id uuid REFERENCES stock_lots(id),
      kind text NOT NULL CHECK (kind IN ('received', 'reserved', 'released', 'drawn')),
      quantity integer NOT NULL CHECK (quantity >= 0 AND quantity <= 100000),
      reserved_used integer NOT NULL DEFAULT 0 CHECK (reserved_used >= 0 AND reserved_used <= quantity),
      short integer NOT NULL DEFAULT 0 CHECK (short >= 0),
      work_order_id uuid REFERENCES work_orders(id),
      part_fitted_id uuid REFERENCES parts_fitted(id),
      releases_id uuid UNIQUE REFERENCES stock_movements(id),
      reason text CHECK (length(reason) <= 500),
      recorded_by uuid NOT NULL REFERENCES users(id),
      recorded_at timestamptz NOT NULL DEFAULT now(),
      CHECK (kind = 'drawn' OR lot_id IS NOT NULL),
      CHECK (kind = 'drawn' OR quantity > 0),
      CHECK (kind <> 'drawn' OR (part_fitted_id IS NOT NULL AND work_order_id IS NOT NULL AND (quantity > 0 OR short > 0))),
      CHECK (kind <> 'reserved' OR work_order_id IS NOT NULL),
      CHECK (kind <> 'released' OR (releases_id IS NOT NULL AND reason IS NOT NULL))
    );
    CREATE INDEX stock_movements_lot_idx ON stock_movements (lot_id, kind);
    CREATE INDEX stock_movements_job_idx ON stock_movements (work_order_id) WHERE work_order_id IS NOT NULL;
    CREATE INDEX stock_movements_part_idx ON stock_movements (part_fitted_id) WHERE part_fitted_id IS NOT NULL;
    CREATE INDEX stock_movements_short_idx ON stock_movements (shop_id, recorded_at) WHERE short > 0;
    CREATE TRIGGER stock_movements_append_only BEFORE UPDATE OR DELETE ON stock_movements
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    -- The batch search's "fitted" side: parts recorded without stock, matched as typed (any case).
    CREATE INDEX parts_fitted_batch_lower_idx ON parts_fitted (shop_id, lower(batch)) WHERE batch IS NOT NULL;
    CREATE INDEX parts_fitted_serial_lower_idx ON parts_fitted (shop_id, lower(serial)) WHERE serial IS NOT NULL;
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP INDEX IF EXISTS parts_fitted_batch_lower_idx, parts_fitted_serial_lower_idx;
    DROP TABLE IF EXISTS stock_movements, stock_lots, stock_deliveries, stock_levels, stock_items;
    DROP FUNCTION IF EXISTS benchtag_stock_lot_guard();
  `.execute(db);
}
