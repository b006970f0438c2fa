import { sql, type Kysely } from "kysely";

// What waits for review, kept small so the review queue, its count in the menu and the
// out-of-tolerance filter cost what waits, not a year of history.
// - review_waiting: one row per stage whose newest sign-off (not withdrawn) has no decision yet,
//   or was approved while a current reading of the stage is out of tolerance and nobody has let it
//   stand; with how many such readings the stage has (out_of_tolerance). It is derived, not a record: the rows of a job are worked out again from the record
//   (sign_offs, withdrawals, review_decisions, measurements, reading_acceptances) by the triggers
//   below, at the end of every statement that adds to those tables, inside the writer's own
//   transaction. Every writer of them holds the shop's sync lock (benchtag_lock_shop_sync), so two
//   writers never work out the same job at once.
//   Approved stages brought back by a flagged entry nobody has accepted are not kept here: where a
//   flagged entry belongs is worked out in lib/review/flagged-work.ts, and db/review/queue.ts adds
//   those stages when it reads.
// - sign_offs_stage_idx: the newest sign-off of one stage, for those flagged stages.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE review_waiting (
      job_procedure_id uuid NOT NULL REFERENCES job_procedures(id),
      stage_key text NOT NULL,
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      sign_off_id uuid NOT NULL REFERENCES sign_offs(id),
      out_of_tolerance integer NOT NULL,
      PRIMARY KEY (job_procedure_id, stage_key)
    );
    CREATE INDEX review_waiting_shop_idx ON review_waiting (shop_id);
    CREATE INDEX review_waiting_job_idx ON review_waiting (work_order_id);
    CREATE INDEX sign_offs_stage_idx ON sign_offs (job_procedure_id, stage_key);

    -- Work out the waiting stages of these jobs again from the record.
    CREATE FUNCTION benchtag_review_waiting_refresh(jobs uuid[]) RETURNS void LANGUAGE plpgsql AS $$
    BEGIN
      DELETE FROM review_waiting WHERE work_order_id = ANY(jobs);
      INSERT INTO review_waiting (job_procedure_id, stage_key, shop_id, work_order_id, sign_off_id, out_of_tolerance)
      SELECT l.job_procedure_id, l.stage_key, w.shop_id, l.work_order_id, l.id, oot.n
      FROM (
        SELECT DISTINCT ON (s.job_procedure_id, s.stage_key) s.id, s.work_order_id, s.job_procedure_id, s.stage_key
        FROM sign_offs s
        JOIN operations o ON o.id = s.id
        WHERE s.work_order_id = ANY(jobs)
          AND NOT EXISTS (SELECT 1 FROM withdrawals x WHERE x.operation_id = s.id)
        ORDER BY s.job_procedure_id, s.stage_key, o.seq DESC
      ) l
      JOIN work_orders w ON w.id = l.work_order_id
      JOIN job_procedures jp ON jp.id = l.job_procedure_id
      LEFT JOIN LATERAL (
        SELECT d.decision FROM review_decisions d WHERE d.sign_off_id = l.id ORDER BY d.change_seq DESC LIMIT 1
      ) standing ON true
      CROSS JOIN LATERAL (
        SELECT count(*)::int AS n FROM current_measurements cm JOIN template_steps ts ON ts.id = cm.step_id
        WHERE cm.work_order_id = l.work_order_id AND ts.template_version_id = jp.template_version_id
          AND ts.stage_key = l.stage_key AND cm.verdict <> 'in'
          AND NOT EXISTS (SELECT 1 FROM reading_acceptances a WHERE a.measurement_id = cm.id)
      ) oot
      WHERE standing.decision IS NULL OR (standing.decision = 'approved' AND oot.n > 0);
    END $$;

    -- After a statement adds rows that can change what waits: the jobs they belong to.
    CREATE FUNCTION benchtag_review_waiting_after_insert() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      jobs uuid[];
    BEGIN
      IF TG_TABLE_NAME = 'review_decisions' THEN
        SELECT array_agg(DISTINCT s.work_order_id) INTO jobs FROM added JOIN sign_offs s ON s.id = added.sign_off_id;
      ELSIF TG_TABLE_NAME = 'reading_acceptances' THEN
        SELECT array_agg(DISTINCT m.work_order_id) INTO jobs FROM added JOIN measurements m ON m.id = added.measurement_id;
      ELSE
        SELECT array_agg(DISTINCT added.work_order_id) INTO jobs FROM added;
      END IF;
      IF jobs IS NOT NULL THEN
        PERFORM benchtag_review_waiting_refresh(jobs);
      END IF;
      RETURN NULL;
    END $$;
    CREATE TRIGGER sign_offs_review_waiting AFTER INSERT ON sign_offs
      REFERENCING NEW TABLE AS added FOR EACH STATEMENT EXECUTE FUNCTION benchtag_review_waiting_after_insert();
    CREATE TRIGGER withdrawals_review_waiting AFTER INSERT ON withdrawals
      REFERENCING NEW TABLE AS added FOR EACH STATEMENT EXECUTE FUNCTION benchtag_review_waiting_after_insert();
    CREATE TRIGGER review_decisions_review_waiting AFTER INSERT ON review_decisions
      REFERENCING NEW TABLE AS added FOR EACH STATEMENT EXECUTE FUNCTION benchtag_review_waiting_after_insert();
    CREATE TRIGGER measurements_review_waiting AFTER INSERT ON measurements
      REFERENCING NEW TABLE AS added FOR EACH STATEMENT EXECUTE FUNCTION benchtag_review_waiting_after_insert();
    CREATE TRIGGER reading_acceptances_review_waiting AFTER INSERT ON reading_acceptances
      REFERENCING NEW TABLE AS added FOR EACH STATEMENT EXECUTE FUNCTION benchtag_review_waiting_after_insert();

    -- What waits already.
    SELECT benchtag_review_waiting_refresh(array_agg(id)) FROM work_orders;
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP TRIGGER IF EXISTS reading_acceptances_review_waiting ON reading_acceptances;
    DROP TRIGGER IF EXISTS measurements_review_waiting ON measurements;
    DROP TRIGGER IF EXISTS review_decisions_review_waiting ON review_decisions;
    DROP TRIGGER IF EXISTS withdrawals_review_waiting ON withdrawals;
    DROP TRIGGER IF EXISTS sign_offs_review_waiting ON sign_offs;
    DROP FUNCTION IF EXISTS benchtag_review_waiting_after_insert();
    DROP FUNCTION IF EXISTS benchtag_review_waiting_refresh(uuid[]);
    DROP INDEX IF EXISTS sign_offs_stage_idx;
    DROP TABLE IF EXISTS review_waiting;
  `.execute(db);
}
