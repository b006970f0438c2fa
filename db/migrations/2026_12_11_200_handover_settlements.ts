import { sql, type Kysely } from "kysely";

// Work a tablet handed over when its session was ended (outbox_handovers) holds the jobs it was
// recorded on: `outbox_handover_jobs` says which jobs and how many entries (and photos whose
// bytes were never uploaded) each (written with the
// hand-over, and here for those already kept), and each stays an open item of the job (the gates
// to "ready" and "handed over") until the office settles it with a written note
// (`outbox_handover_settlements`: what was re-entered, or why nothing needs to be). Both append-only.

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE outbox_handover_jobs (
      handover_id uuid NOT NULL REFERENCES outbox_handovers(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      shop_id uuid NOT NULL REFERENCES shops(id),
      entry_count integer NOT NULL CHECK (entry_count >= 0),
      photo_count integer NOT NULL DEFAULT 0 CHECK (photo_count >= 0),
      CHECK (entry_count + photo_count > 0),
      PRIMARY KEY (handover_id, work_order_id)
    );
    CREATE INDEX outbox_handover_jobs_work_order_idx ON outbox_handover_jobs (work_order_id);
    CREATE TRIGGER outbox_handover_jobs_append_only BEFORE UPDATE OR DELETE ON outbox_handover_jobs
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE outbox_handover_settlements (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      handover_id uuid NOT NULL,
      work_order_id uuid NOT NULL,
      shop_id uuid NOT NULL REFERENCES shops(id),
      note text NOT NULL CHECK (length(note) BETWEEN 1 AND 2000),
      settled_by uuid NOT NULL REFERENCES users(id),
      settled_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (handover_id, work_order_id),
      FOREIGN KEY (handover_id, work_order_id) REFERENCES outbox_handover_jobs (handover_id, work_order_id)
    );
    CREATE TRIGGER outbox_handover_settlements_append_only BEFORE UPDATE OR DELETE ON outbox_handover_settlements
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    INSERT INTO outbox_handover_jobs (handover_id, work_order_id, shop_id, entry_count)
    SELECT h.id, w.id, h.shop_id, count(*)
    FROM outbox_handovers h
    CROSS JOIN LATERAL jsonb_array_elements(CASE WHEN jsonb_typeof(h.entries) = 'array' THEN h.entries ELSE '[]'::jsonb END) AS e(entry)
    JOIN work_orders w ON w.shop_id = h.shop_id AND w.id::text = lower(e.entry ->> 'workOrderId')
    WHERE jsonb_typeof(e.entry) = 'object'
    GROUP BY h.id, w.id, h.shop_id;
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`DROP TABLE IF EXISTS outbox_handover_settlements, outbox_handover_jobs`.execute(db);
}
