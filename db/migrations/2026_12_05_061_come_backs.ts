import { sql, type Kysely } from "kysely";

// Come-backs: a bike that returns after handover with a fault that may be ours. A come-back is a
// work order of its own (the normal flow from booked in to handed over), linked here to the
// original work order it came back from. The office's findings on it (warranty yes/no and what
// caused it) are append-only: a later finding replaces the one before by pointing at it.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE come_backs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL UNIQUE REFERENCES work_orders(id),
      original_work_order_id uuid NOT NULL REFERENCES work_orders(id),
      rider_report text NOT NULL CHECK (length(rider_report) BETWEEN 1 AND 2000),
      warranty_claimed boolean NOT NULL,
      opened_by uuid NOT NULL REFERENCES users(id),
      opened_at timestamptz NOT NULL DEFAULT now(),
      CHECK (work_order_id <> original_work_order_id)
    );
    CREATE INDEX come_backs_original_idx ON come_backs (original_work_order_id);
    CREATE INDEX come_backs_shop_idx ON come_backs (shop_id, opened_at);
    CREATE TRIGGER come_backs_append_only BEFORE UPDATE OR DELETE ON come_backs
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE come_back_findings (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      come_back_id uuid NOT NULL REFERENCES come_backs(id),
      under_warranty boolean NOT NULL,
      cause text NOT NULL CHECK (cause IN ('our_workmanship', 'part_failed', 'not_our_work', 'nothing_found')),
      note text NOT NULL CHECK (length(note) BETWEEN 1 AND 2000),
      replaces_id uuid UNIQUE REFERENCES come_back_findings(id),
      recorded_by uuid NOT NULL REFERENCES users(id),
      recorded_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX come_back_findings_idx ON come_back_findings (come_back_id, recorded_at);
    CREATE TRIGGER come_back_findings_append_only BEFORE UPDATE OR DELETE ON come_back_findings
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`DROP TABLE IF EXISTS come_back_findings; DROP TABLE IF EXISTS come_backs;`.execute(db);
}
