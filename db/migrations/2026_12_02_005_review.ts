import { sql, type Kysely } from "kysely";

// Supervisor review: written acceptances of out-of-tolerance readings, and the notices a sign-off
// leaves for the supervisors' e-mail (an outbox, filled by a trigger inside the sync merge's own
// transaction and sent after it commits, so the e-mail intent is never lost and the merge stays fast).
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    -- A supervisor's written reason for letting an out-of-tolerance reading stand. Made together
    -- with a decision; never edited or removed. One acceptance per reading: a new reading (a
    -- correction) needs its own.
    CREATE TABLE reading_acceptances (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      measurement_id uuid NOT NULL UNIQUE REFERENCES measurements(id),
      decision_id uuid NOT NULL REFERENCES review_decisions(id),
      justification text NOT NULL CHECK (length(btrim(justification)) > 0),
      accepted_by uuid NOT NULL REFERENCES users(id),
      accepted_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX reading_acceptances_decision_idx ON reading_acceptances (decision_id);
    CREATE TRIGGER reading_acceptances_append_only BEFORE UPDATE OR DELETE ON reading_acceptances
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    -- One notice per sign-off. state: waiting → sent | not_needed (no reading out of tolerance,
    -- or already decided) | failed (gave up after repeated SMTP failures; last_error says why).
    CREATE TABLE review_notices (
      id bigserial PRIMARY KEY,
      shop_id uuid NOT NULL REFERENCES shops(id),
      sign_off_id uuid NOT NULL UNIQUE REFERENCES sign_offs(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      state text NOT NULL DEFAULT 'waiting' CHECK (state IN ('waiting','sending','sent','not_needed','failed')),
      attempts integer NOT NULL DEFAULT 0,
      claimed_at timestamptz,
      last_error text,
      created_at timestamptz NOT NULL DEFAULT now(),
      done_at timestamptz
    );
    CREATE INDEX review_notices_open_idx ON review_notices (state, id) WHERE state IN ('waiting','sending');

    CREATE FUNCTION benchtag_sign_off_notice() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      INSERT INTO review_notices (shop_id, sign_off_id, work_order_id)
        SELECT w.shop_id, NEW.id, NEW.work_order_id FROM work_orders w WHERE w.id = NEW.work_order_id
        ON CONFLICT (sign_off_id) DO NOTHING;
      RETURN NULL;
    END $$;
    CREATE TRIGGER sign_offs_review_notice AFTER INSERT ON sign_offs
      FOR EACH ROW EXECUTE FUNCTION benchtag_sign_off_notice();

    -- The audit page filters per job and pages newest first.
    CREATE INDEX audit_log_shop_id_idx ON audit_log (shop_id, id);
    CREATE INDEX audit_log_job_id_idx ON audit_log (work_order_id, id);
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP INDEX IF EXISTS audit_log_job_id_idx, audit_log_shop_id_idx;
    DROP TRIGGER IF EXISTS sign_offs_review_notice ON sign_offs;
    DROP FUNCTION IF EXISTS benchtag_sign_off_notice();
    DROP TABLE IF EXISTS review_notices, reading_acceptances;
  `.execute(db);
}
