import { sql, type Kysely } from "kysely";

// A work order's build sheet (lib/build-figures/build-sheet.ts): the targets (compression ratio,
// planned boost) and the figures that come from parts makers' sheets rather than the bench (piston
// dish, rod length, intake closing from the cam card). Each save is a new row; the newest is current.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE build_sheets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      figures jsonb NOT NULL,
      created_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX build_sheets_job_idx ON build_sheets (shop_id, work_order_id, created_at);
    CREATE TRIGGER build_sheets_append_only BEFORE UPDATE OR DELETE ON build_sheets
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`DROP TABLE IF EXISTS build_sheets;`.execute(db);
}
