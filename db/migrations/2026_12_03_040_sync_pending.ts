import { sql, type Kysely } from "kysely";

// Late arrivals: an operation whose record has not reached the server yet (a correction of a
// reading, a stop or override of a timer whose start is still on another tablet or in a later
// batch) is held here, then applied in the merge that brings its record, in stamp order. A row is
// never deleted: `resolution` says what became of it (applied as an operation, refused when its
// record came and did not fit, or discarded by the tablet with a reason, in the audit log).
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE sync_pending_operations (
      id uuid PRIMARY KEY,
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      author_id uuid NOT NULL REFERENCES users(id),
      author_role text NOT NULL CHECK (author_role IN ('mechanic','supervisor','office','customer')),
      device_id text NOT NULL,
      stamp text NOT NULL,
      operation jsonb NOT NULL,
      target_kind text NOT NULL,
      target_id uuid NOT NULL,
      reason text NOT NULL,
      batch_cursor bigint,
      received_at timestamptz NOT NULL DEFAULT now(),
      resolved_at timestamptz,
      resolution text CHECK (resolution IN ('applied','refused','discarded')),
      CHECK ((resolved_at IS NULL) = (resolution IS NULL))
    );
    CREATE INDEX sync_pending_target_idx ON sync_pending_operations (shop_id, target_id) WHERE resolved_at IS NULL;

    -- The earliest override of a timer (by stamp) stands, whatever order they arrive in: the merge
    -- looks a timer's overrides up by its id.
    CREATE INDEX operations_timer_idx ON operations ((payload->>'timerId')) WHERE kind LIKE 'timer.%';
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP INDEX IF EXISTS operations_timer_idx;
    DROP TABLE IF EXISTS sync_pending_operations;
  `.execute(db);
}
