import { sql, type Kysely } from "kysely";

// Nothing leaves the shop unreviewed, and a closed record stays closed:
// - flag_acceptances: a supervisor's written acceptance of one flagged bench entry (any kind of
//   operation the sync kept and flagged), made with a review decision; one per entry, kept for good;
// - status_overrides: the office moving a work order to ready or handed over while items were
//   still open, with the reason and the open items at that moment;
// - report_revisions: the build report PDF stored in object storage at handover (revision 1) and
//   after each later accepted change (2, 3, …), with its SHA-256 and the lines it printed, so the
//   next revision can list what changed.
// All three are append-only.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE flag_acceptances (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      operation_id uuid NOT NULL UNIQUE REFERENCES operations(id),
      decision_id uuid NOT NULL REFERENCES review_decisions(id),
      justification text NOT NULL CHECK (length(btrim(justification)) > 0),
      accepted_by uuid NOT NULL REFERENCES users(id),
      accepted_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX flag_acceptances_decision_idx ON flag_acceptances (decision_id);
    CREATE TRIGGER flag_acceptances_append_only BEFORE UPDATE OR DELETE ON flag_acceptances
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    -- The flagged entries of a shop are read by the review queue and the gates.
    CREATE INDEX operations_flagged_idx ON operations (shop_id, work_order_id) WHERE flagged;

    CREATE TABLE status_overrides (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      transition_id uuid NOT NULL UNIQUE REFERENCES work_order_transitions(id),
      from_status text NOT NULL,
      to_status text NOT NULL CHECK (to_status IN ('ready','handed_over')),
      reason text NOT NULL CHECK (length(btrim(reason)) >= 15),
      open_items jsonb NOT NULL CHECK (jsonb_typeof(open_items) = 'array' AND jsonb_array_length(open_items) > 0),
      by_user_id uuid NOT NULL REFERENCES users(id),
      at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX status_overrides_job_idx ON status_overrides (work_order_id, at);
    CREATE TRIGGER status_overrides_append_only BEFORE UPDATE OR DELETE ON status_overrides
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE report_revisions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      revision integer NOT NULL CHECK (revision >= 1),
      handed_over boolean NOT NULL,
      object_key text NOT NULL UNIQUE,
      sha256 text NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
      byte_size integer NOT NULL CHECK (byte_size > 0),
      lines jsonb NOT NULL CHECK (jsonb_typeof(lines) = 'array'),
      changes jsonb NOT NULL DEFAULT '[]' CHECK (jsonb_typeof(changes) = 'array'),
      basis text NOT NULL,
      made_by uuid REFERENCES users(id),
      made_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (work_order_id, revision),
      CHECK (handed_over = (revision = 1))
    );
    CREATE TRIGGER report_revisions_append_only BEFORE UPDATE OR DELETE ON report_revisions
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP TABLE IF EXISTS report_revisions, status_overrides, flag_acceptances;
    DROP INDEX IF EXISTS operations_flagged_idx;
  `.execute(db);
}
