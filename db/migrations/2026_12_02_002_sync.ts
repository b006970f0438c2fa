import { sql, type Kysely } from "kysely";

// Offline bench sync: one change sequence for operations and review decisions, a per-shop sync
// lock that makes the sequence safe to page by, the "current reading" view, and indexes the merge
// and the change feed read by.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    -- Every writer of sync-visible rows in a shop (operations, review decisions) takes this lock
    -- first, so sequence numbers in a shop become visible in order: a device that has seen seq N
    -- can never later find a row with seq < N appear.
    CREATE FUNCTION benchtag_lock_shop_sync(shop uuid) RETURNS void LANGUAGE sql AS $$
      SELECT pg_advisory_xact_lock(4242, hashtext(shop::text))
    $$;

    -- Review decisions share the operations sequence, so one cursor covers both.
    ALTER TABLE review_decisions ADD COLUMN change_seq bigint NOT NULL DEFAULT nextval('operations_seq_seq');

    CREATE FUNCTION benchtag_review_decision_seq() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      shop uuid;
    BEGIN
      SELECT w.shop_id INTO shop
        FROM sign_offs s JOIN work_orders w ON w.id = s.work_order_id
        WHERE s.id = NEW.sign_off_id;
      IF shop IS NOT NULL THEN
        PERFORM benchtag_lock_shop_sync(shop);
      END IF;
      NEW.change_seq := nextval('operations_seq_seq');
      RETURN NEW;
    END $$;
    CREATE TRIGGER review_decisions_change_seq BEFORE INSERT ON review_decisions
      FOR EACH ROW EXECUTE FUNCTION benchtag_review_decision_seq();

    -- A photo queued on a tablet: the row exists before its bytes are uploaded.
    ALTER TABLE attachments ADD COLUMN awaiting_upload boolean NOT NULL DEFAULT false;

    CREATE INDEX operations_shop_seq_idx ON operations (shop_id, seq);
    CREATE INDEX review_decisions_change_seq_idx ON review_decisions (change_seq);
    CREATE INDEX review_decisions_sign_off_idx ON review_decisions (sign_off_id);
    CREATE INDEX sign_offs_job_idx ON sign_offs (work_order_id);
    CREATE INDEX measurements_supersedes_idx ON measurements (supersedes_id) WHERE supersedes_id IS NOT NULL;
    CREATE INDEX timers_job_idx ON timers (work_order_id);
    CREATE INDEX attachments_job_idx ON attachments (work_order_id);
    CREATE INDEX audit_log_refused_entity_idx ON audit_log (entity, entity_id) WHERE outcome = 'refused';

    -- The current reading of each spot (job, spec, reading index): the latest stamp among the
    -- readings no other reading supersedes. Stamps compare byte-wise (COLLATE "C").
    CREATE VIEW current_measurements AS
      SELECT DISTINCT ON (m.work_order_id, m.spec_id, m.reading_index)
        m.id, m.work_order_id, m.step_id, m.spec_id, m.reading_index, m.value, m.unit, m.verdict,
        m.note, m.supersedes_id, m.recorded_by, m.device_id, m.device_time, m.stamp, m.received_at,
        o.flagged, o.flag_reason
      FROM measurements m
      JOIN operations o ON o.id = m.id
      WHERE NOT EXISTS (SELECT 1 FROM measurements later WHERE later.supersedes_id = m.id)
      ORDER BY m.work_order_id, m.spec_id, m.reading_index, m.stamp COLLATE "C" DESC, m.id DESC;
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP VIEW IF EXISTS current_measurements;
    DROP INDEX IF EXISTS audit_log_refused_entity_idx, attachments_job_idx, timers_job_idx,
      measurements_supersedes_idx, sign_offs_job_idx, review_decisions_sign_off_idx,
      review_decisions_change_seq_idx, operations_shop_seq_idx;
    ALTER TABLE attachments DROP COLUMN IF EXISTS awaiting_upload;
    DROP TRIGGER IF EXISTS review_decisions_change_seq ON review_decisions;
    DROP FUNCTION IF EXISTS benchtag_review_decision_seq();
    ALTER TABLE review_decisions DROP COLUMN IF EXISTS change_seq;
    DROP FUNCTION IF EXISTS benchtag_lock_shop_sync(uuid);
  `.execute(db);
}
