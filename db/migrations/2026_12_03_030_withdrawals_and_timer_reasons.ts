import { sql, type Kysely } from "kysely";

// The bench takes back its own mistakes and says why its timers ended.
// - withdrawals: an entry (torque bolt, step completion, part, photo, stage sign-off) withdrawn by
//   an `entry.withdrawn` operation. The entry's own row stays as it was; this row marks it
//   withdrawn, with who, when and why. The first withdrawal of an entry stands (unique operation_id);
//   later ones stay in the operations and the audit log. Append-only.
// - timers: when an override was made (it releases the hold from then), who stopped a timer and
//   why, and a cancel (started by mistake: the timer no longer counts), with who and why.
// - attachments: the operation that queued a bench photo (so a withdrawal can name it).
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE withdrawals (
      id uuid PRIMARY KEY REFERENCES operations(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      operation_id uuid NOT NULL UNIQUE REFERENCES operations(id),
      target_kind text NOT NULL,
      withdrawn_by uuid NOT NULL REFERENCES users(id),
      reason text NOT NULL CHECK (length(reason) BETWEEN 3 AND 500),
      device_time timestamptz NOT NULL,
      received_at timestamptz NOT NULL DEFAULT now(),
      CHECK (operation_id <> id)
    );
    CREATE INDEX withdrawals_job_idx ON withdrawals (work_order_id);
    CREATE TRIGGER withdrawals_append_only BEFORE UPDATE OR DELETE ON withdrawals
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    ALTER TABLE timers
      ADD COLUMN override_at timestamptz,
      ADD COLUMN stopped_by uuid REFERENCES users(id),
      ADD COLUMN stop_reason text,
      ADD COLUMN cancelled_at timestamptz,
      ADD COLUMN cancelled_by uuid REFERENCES users(id),
      ADD COLUMN cancel_reason text,
      ADD CONSTRAINT timers_cancel_whole CHECK ((cancelled_at IS NULL) = (cancel_reason IS NULL));

    -- Overrides already on file: the time of the first override operation of the timer.
    UPDATE timers t SET override_at = o.device_time
    FROM (
      SELECT DISTINCT ON (payload->>'timerId') payload->>'timerId' AS timer_id, device_time
      FROM operations WHERE kind = 'timer.overridden' ORDER BY payload->>'timerId', seq
    ) o
    WHERE t.id::text = o.timer_id AND t.override_by IS NOT NULL;

    ALTER TABLE attachments ADD COLUMN operation_id uuid REFERENCES operations(id);
    UPDATE attachments a SET operation_id = o.id
    FROM operations o WHERE o.kind = 'photo.queued' AND o.payload->>'attachmentId' = a.id::text;
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE attachments DROP COLUMN IF EXISTS operation_id;
    ALTER TABLE timers DROP CONSTRAINT IF EXISTS timers_cancel_whole,
      DROP COLUMN IF EXISTS cancel_reason, DROP COLUMN IF EXISTS cancelled_by, DROP COLUMN IF EXISTS cancelled_at,
      DROP COLUMN IF EXISTS stop_reason, DROP COLUMN IF EXISTS stopped_by, DROP COLUMN IF EXISTS override_at;
    DROP TABLE IF EXISTS withdrawals;
  `.execute(db);
}
