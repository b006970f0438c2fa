import { sql, type Kysely } from "kysely";

// Foundation schema. Every business row carries shop_id (the tenant); queries are scoped by it.
// Money is integer minor units; readings keep their unit; timestamps are timestamptz.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE EXTENSION IF NOT EXISTS pgcrypto;

    CREATE TABLE shops (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      slug text NOT NULL UNIQUE,
      time_zone text NOT NULL DEFAULT 'UTC',
      torque_unit text NOT NULL DEFAULT 'N·m' CHECK (torque_unit IN ('N·m','lbf·ft')),
      currency text NOT NULL DEFAULT 'EUR',
      tax_rate_bp integer NOT NULL DEFAULT 0 CHECK (tax_rate_bp >= 0),
      created_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE customers (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      name text NOT NULL,
      email text,
      phone text,
      notes text NOT NULL DEFAULT '',
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX customers_shop_idx ON customers (shop_id, name);

    CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      email text NOT NULL UNIQUE,
      name text NOT NULL,
      role text NOT NULL CHECK (role IN ('mechanic','supervisor','office','customer')),
      password_hash text NOT NULL,
      customer_id uuid REFERENCES customers(id),
      active boolean NOT NULL DEFAULT true,
      created_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((role = 'customer') = (customer_id IS NOT NULL))
    );
    CREATE INDEX users_shop_idx ON users (shop_id);

    CREATE TABLE bikes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      customer_id uuid NOT NULL REFERENCES customers(id),
      make text NOT NULL,
      model text NOT NULL,
      year integer CHECK (year BETWEEN 1900 AND 2100),
      vin text,
      engine_number text,
      displacement_cc integer CHECK (displacement_cc > 0),
      colour text,
      tag_code text NOT NULL UNIQUE,
      notes text NOT NULL DEFAULT '',
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX bikes_shop_idx ON bikes (shop_id);
    CREATE INDEX bikes_customer_idx ON bikes (customer_id);

    CREATE TABLE procedure_templates (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      key text NOT NULL,
      name text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (shop_id, key)
    );

    -- A version is immutable once written; editing a template writes a new version.
    CREATE TABLE template_versions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      template_id uuid NOT NULL REFERENCES procedure_templates(id),
      version integer NOT NULL CHECK (version > 0),
      name text NOT NULL,
      summary text NOT NULL DEFAULT '',
      example_only boolean NOT NULL DEFAULT false,
      created_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (template_id, version)
    );

    CREATE TABLE template_steps (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      template_version_id uuid NOT NULL REFERENCES template_versions(id),
      stage_key text NOT NULL,
      stage_title text NOT NULL,
      stage_position integer NOT NULL,
      position integer NOT NULL,
      key text NOT NULL,
      title text NOT NULL,
      instructions text NOT NULL DEFAULT '',
      cautions jsonb NOT NULL DEFAULT '[]',
      requires_photo boolean NOT NULL DEFAULT false,
      waits_for_step_key text,
      UNIQUE (template_version_id, key),
      UNIQUE (template_version_id, stage_position, position)
    );

    CREATE TABLE torque_specs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      step_id uuid NOT NULL REFERENCES template_steps(id),
      label text NOT NULL,
      final_value numeric NOT NULL CHECK (final_value > 0),
      unit text NOT NULL CHECK (unit IN ('N·m','lbf·ft','lbf·in','kgf·m')),
      passes jsonb NOT NULL DEFAULT '[]',
      angle_passes jsonb NOT NULL DEFAULT '[]',
      pattern text NOT NULL CHECK (pattern IN ('cross','spiral-out','linear')),
      bolt_count integer NOT NULL CHECK (bolt_count BETWEEN 1 AND 64),
      lubricant text NOT NULL DEFAULT '',
      torque_to_yield boolean NOT NULL DEFAULT false
    );

    CREATE TABLE measurement_specs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      step_id uuid NOT NULL REFERENCES template_steps(id),
      key text NOT NULL,
      label text NOT NULL,
      nominal numeric,
      min numeric NOT NULL,
      max numeric NOT NULL,
      unit text NOT NULL CHECK (unit IN ('mm','in','µm')),
      reading_labels text[] NOT NULL DEFAULT '{}',
      geometry text CHECK (geometry IN ('bore','oil-clearance')),
      CHECK (min <= max),
      UNIQUE (step_id, key)
    );

    CREATE TABLE timer_specs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      step_id uuid NOT NULL REFERENCES template_steps(id),
      label text NOT NULL,
      duration_s integer NOT NULL CHECK (duration_s > 0),
      blocks_step_key text
    );

    CREATE TABLE work_orders (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      bike_id uuid NOT NULL REFERENCES bikes(id),
      number integer NOT NULL,
      title text NOT NULL,
      status text NOT NULL,
      complaint text NOT NULL DEFAULT '',
      intake_odometer_km integer CHECK (intake_odometer_km >= 0),
      assigned_mechanic_id uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      closed_at timestamptz,
      UNIQUE (shop_id, number)
    );
    CREATE INDEX work_orders_bike_idx ON work_orders (bike_id);
    CREATE INDEX work_orders_shop_status_idx ON work_orders (shop_id, status);

    CREATE TABLE work_order_transitions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      from_status text,
      to_status text NOT NULL,
      by_user_id uuid REFERENCES users(id),
      note text NOT NULL DEFAULT '',
      at timestamptz NOT NULL DEFAULT now()
    );

    -- A procedure run on a job pins the template version it was started with.
    CREATE TABLE job_procedures (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      template_version_id uuid NOT NULL REFERENCES template_versions(id),
      position integer NOT NULL,
      UNIQUE (work_order_id, position)
    );

    -- Every bench operation that reached the server, in arrival order (seq is the sync cursor).
    CREATE TABLE operations (
      id uuid PRIMARY KEY,
      seq bigserial UNIQUE,
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      kind text NOT NULL,
      author_id uuid NOT NULL REFERENCES users(id),
      device_id text NOT NULL,
      device_time timestamptz NOT NULL,
      stamp text NOT NULL,
      payload jsonb NOT NULL,
      flagged boolean NOT NULL DEFAULT false,
      flag_reason text,
      received_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX operations_job_idx ON operations (work_order_id, stamp);

    CREATE TABLE step_completions (
      id uuid PRIMARY KEY REFERENCES operations(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      step_id uuid NOT NULL REFERENCES template_steps(id),
      completed_by uuid NOT NULL REFERENCES users(id),
      device_time timestamptz NOT NULL,
      received_at timestamptz NOT NULL DEFAULT now(),
      flagged boolean NOT NULL DEFAULT false,
      flag_reason text
    );
    CREATE INDEX step_completions_job_idx ON step_completions (work_order_id, step_id);

    -- Readings are append-only: a correction is a new row that names the one it supersedes.
    CREATE TABLE measurements (
      id uuid PRIMARY KEY REFERENCES operations(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      step_id uuid NOT NULL REFERENCES template_steps(id),
      spec_id uuid NOT NULL REFERENCES measurement_specs(id),
      reading_index integer NOT NULL DEFAULT 0,
      value numeric NOT NULL,
      unit text NOT NULL CHECK (unit IN ('mm','in','µm')),
      verdict text NOT NULL CHECK (verdict IN ('in','low','high')),
      note text NOT NULL DEFAULT '',
      supersedes_id uuid REFERENCES measurements(id),
      recorded_by uuid NOT NULL REFERENCES users(id),
      device_id text NOT NULL,
      device_time timestamptz NOT NULL,
      stamp text NOT NULL,
      received_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX measurements_job_idx ON measurements (work_order_id, spec_id, reading_index);

    CREATE TABLE torque_records (
      id uuid PRIMARY KEY REFERENCES operations(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      step_id uuid NOT NULL REFERENCES template_steps(id),
      torque_spec_id uuid NOT NULL REFERENCES torque_specs(id),
      pass_index integer NOT NULL,
      bolt integer NOT NULL,
      wrench_reading numeric,
      wrench_unit text,
      recorded_by uuid NOT NULL REFERENCES users(id),
      device_time timestamptz NOT NULL,
      received_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX torque_records_job_idx ON torque_records (work_order_id, torque_spec_id);

    CREATE TABLE timers (
      id uuid PRIMARY KEY,
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      step_id uuid NOT NULL REFERENCES template_steps(id),
      timer_spec_id uuid REFERENCES timer_specs(id),
      label text NOT NULL,
      duration_s integer NOT NULL CHECK (duration_s > 0),
      started_at timestamptz NOT NULL,
      started_by uuid NOT NULL REFERENCES users(id),
      stopped_at timestamptz,
      override_by uuid REFERENCES users(id),
      override_reason text
    );

    CREATE TABLE sign_offs (
      id uuid PRIMARY KEY REFERENCES operations(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      job_procedure_id uuid NOT NULL REFERENCES job_procedures(id),
      stage_key text NOT NULL,
      signed_by uuid NOT NULL REFERENCES users(id),
      device_time timestamptz NOT NULL,
      received_at timestamptz NOT NULL DEFAULT now()
    );

    -- Decisions are final records: a later one supersedes, none is edited.
    CREATE TABLE review_decisions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      sign_off_id uuid NOT NULL REFERENCES sign_offs(id),
      decision text NOT NULL CHECK (decision IN ('approved','sent_back')),
      reason text NOT NULL DEFAULT '',
      reopened_step_ids uuid[] NOT NULL DEFAULT '{}',
      decided_by uuid NOT NULL REFERENCES users(id),
      decided_at timestamptz NOT NULL DEFAULT now(),
      CHECK (decision = 'approved' OR length(reason) > 0)
    );

    CREATE TABLE parts_fitted (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      step_id uuid REFERENCES template_steps(id),
      part_number text NOT NULL,
      description text NOT NULL DEFAULT '',
      supplier text NOT NULL DEFAULT '',
      serial text,
      batch text,
      quantity integer NOT NULL DEFAULT 1 CHECK (quantity > 0),
      fitted_by uuid REFERENCES users(id),
      fitted_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX parts_fitted_batch_idx ON parts_fitted (shop_id, batch);
    CREATE INDEX parts_fitted_serial_idx ON parts_fitted (shop_id, serial);

    CREATE TABLE attachments (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid REFERENCES work_orders(id),
      bike_id uuid REFERENCES bikes(id),
      step_id uuid REFERENCES template_steps(id),
      purpose text NOT NULL CHECK (purpose IN ('intake','teardown','step','reading','dyno','report')),
      object_key text NOT NULL UNIQUE,
      content_type text NOT NULL,
      byte_size integer NOT NULL CHECK (byte_size >= 0),
      caption text NOT NULL DEFAULT '',
      uploaded_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now()
    );

    -- Append-only audit log: every operation and decision, accepted or refused, with why.
    CREATE TABLE audit_log (
      id bigserial PRIMARY KEY,
      shop_id uuid REFERENCES shops(id),
      at timestamptz NOT NULL DEFAULT now(),
      actor_id uuid REFERENCES users(id),
      device_id text,
      action text NOT NULL,
      entity text NOT NULL,
      entity_id text,
      work_order_id uuid REFERENCES work_orders(id),
      outcome text NOT NULL CHECK (outcome IN ('accepted','refused')),
      reason text,
      detail jsonb NOT NULL DEFAULT '{}'
    );
    CREATE INDEX audit_log_shop_idx ON audit_log (shop_id, at);
    CREATE INDEX audit_log_job_idx ON audit_log (work_order_id, at);

    CREATE FUNCTION benchtag_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION '% is append-only: % refused', TG_TABLE_NAME, TG_OP;
    END $$;
    CREATE TRIGGER audit_log_append_only BEFORE UPDATE OR DELETE ON audit_log
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
    CREATE TRIGGER measurements_append_only BEFORE UPDATE OR DELETE ON measurements
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
    CREATE TRIGGER review_decisions_append_only BEFORE UPDATE OR DELETE ON review_decisions
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
    CREATE TRIGGER sign_offs_append_only BEFORE UPDATE OR DELETE ON sign_offs
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    -- Sign-in attempts, for rate limiting across app instances.
    CREATE TABLE sign_in_attempts (
      id bigserial PRIMARY KEY,
      key text NOT NULL,
      succeeded boolean NOT NULL,
      at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX sign_in_attempts_key_idx ON sign_in_attempts (key, at);
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP TABLE IF EXISTS sign_in_attempts, audit_log, attachments, parts_fitted, review_decisions,
      sign_offs, timers, torque_records, measurements, step_completions, operations, job_procedures,
      work_order_transitions, work_orders, timer_specs, measurement_specs, torque_specs, template_steps,
      template_versions, procedure_templates, bikes, users, customers, shops CASCADE;
    DROP FUNCTION IF EXISTS benchtag_refuse_change();
  `.execute(db);
}
