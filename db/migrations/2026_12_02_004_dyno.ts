import { sql, type Kysely } from "kysely";

// Dyno runs on a work order and their curve points. Readings keep what was entered: torque in the
// unit it was recorded in (torque_unit), boost in its unit; nothing is rounded on the way in.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE dyno_runs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      label text NOT NULL CHECK (length(label) BETWEEN 1 AND 80),
      ran_on date NOT NULL,
      boost_target numeric NOT NULL CHECK (boost_target >= 0),
      boost_unit text NOT NULL CHECK (boost_unit IN ('psi','kPa','bar')),
      pressure_kpa numeric NOT NULL CHECK (pressure_kpa > 0),
      temperature_c numeric NOT NULL,
      humidity_percent numeric NOT NULL CHECK (humidity_percent BETWEEN 0 AND 100),
      correction_standard text NOT NULL CHECK (correction_standard IN ('SAE_J1349','DIN_70020','ISO_1585','SAE_J607')),
      torque_unit text NOT NULL CHECK (torque_unit IN ('N·m','lbf·ft')),
      notes text NOT NULL DEFAULT '',
      source text NOT NULL CHECK (source IN ('table','csv')),
      created_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX dyno_runs_job_idx ON dyno_runs (shop_id, work_order_id, ran_on);

    CREATE TABLE dyno_points (
      run_id uuid NOT NULL REFERENCES dyno_runs(id) ON DELETE CASCADE,
      position integer NOT NULL CHECK (position >= 0),
      rpm numeric NOT NULL CHECK (rpm > 0),
      torque numeric NOT NULL,
      PRIMARY KEY (run_id, position)
    );
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`DROP TABLE IF EXISTS dyno_points, dyno_runs;`.execute(db);
}
