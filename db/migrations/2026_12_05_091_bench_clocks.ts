import { sql, type Kysely } from "kysely";

// Time at the bench. A mechanic clocks on a job (optionally a stage) and off again from the
// tablet (`clock.on`, `clock.off` operations); a supervisor closes a clock left running, with a
// reason. Both tables are append-only: a clock is never edited, and its end is a row of its own.
// A clock ends at its earliest end on record or at its mechanic's next clock-on, whichever comes
// first (lib/clock/spans.ts); nothing here stores that derived end.
// - bench_clocks: one row per clock-on (id = the tablet's clockId; operation_id = the operation).
// - bench_clock_ends: a clock-off (from the bench, with its operation) or a supervisor's close
//   (who, when it is taken to have ended, why, and when it was recorded).
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE bench_clocks (
      id uuid PRIMARY KEY,
      operation_id uuid NOT NULL UNIQUE REFERENCES operations(id),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      job_procedure_id uuid REFERENCES job_procedures(id),
      stage_key text,
      mechanic_id uuid NOT NULL REFERENCES users(id),
      started_at timestamptz NOT NULL,
      received_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((job_procedure_id IS NULL) = (stage_key IS NULL))
    );
    CREATE INDEX bench_clocks_job_idx ON bench_clocks (work_order_id);
    CREATE INDEX bench_clocks_mechanic_idx ON bench_clocks (mechanic_id, started_at);
    CREATE TRIGGER bench_clocks_append_only BEFORE UPDATE OR DELETE ON bench_clocks
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE bench_clock_ends (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clock_id uuid NOT NULL REFERENCES bench_clocks(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      kind text NOT NULL CHECK (kind IN ('clocked-off', 'closed-by-supervisor')),
      ended_at timestamptz NOT NULL,
      recorded_by uuid NOT NULL REFERENCES users(id),
      reason text CHECK (reason IS NULL OR length(reason) BETWEEN 3 AND 500),
      operation_id uuid UNIQUE REFERENCES operations(id),
      recorded_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((kind = 'clocked-off') = (operation_id IS NOT NULL)),
      CHECK (kind = 'clocked-off' OR reason IS NOT NULL)
    );
    CREATE INDEX bench_clock_ends_clock_idx ON bench_clock_ends (clock_id);
    CREATE TRIGGER bench_clock_ends_append_only BEFORE UPDATE OR DELETE ON bench_clock_ends
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP TABLE IF EXISTS bench_clock_ends;
    DROP TABLE IF EXISTS bench_clocks;
  `.execute(db);
}
