import { sql, type Kysely } from "kysely";

// Parts fitted recorded at the bench (sync operation `part.fitted`). The row's id is the one the
// tablet chose; `operation_id` links it to the operation that brought it (null for parts the
// office recorded), which also carries any flag for the supervisor. Bench-recorded parts are
// append-only, like readings: a wrong entry stays on record beside the right one.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE parts_fitted ADD COLUMN operation_id uuid UNIQUE REFERENCES operations(id);
    CREATE INDEX parts_fitted_job_idx ON parts_fitted (work_order_id, fitted_at);
    CREATE TRIGGER parts_fitted_bench_append_only BEFORE UPDATE OR DELETE ON parts_fitted
      FOR EACH ROW WHEN (OLD.operation_id IS NOT NULL) EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP TRIGGER IF EXISTS parts_fitted_bench_append_only ON parts_fitted;
    DROP INDEX IF EXISTS parts_fitted_job_idx;
    ALTER TABLE parts_fitted DROP COLUMN IF EXISTS operation_id;
  `.execute(db);
}
