import { sql, type Kysely } from "kysely";

// Tune versions of a work order: the file loaded on the bike, kept in object storage under its
// SHA-256, with a version label, notes, who uploaded it and when. Append-only: a newer tune is a new
// row. A dyno run names the tune it ran (a tune of the same work order, checked by the key pair),
// or none when the bike ran without a tune file of the shop's.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE tune_versions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      label text NOT NULL CHECK (length(label) BETWEEN 1 AND 80),
      notes text NOT NULL DEFAULT '' CHECK (length(notes) <= 2000),
      file_name text NOT NULL CHECK (length(file_name) BETWEEN 1 AND 200),
      content_type text NOT NULL CHECK (length(content_type) BETWEEN 1 AND 200),
      size_bytes integer NOT NULL CHECK (size_bytes >= 1),
      sha256 text NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
      object_key text NOT NULL UNIQUE,
      uploaded_by uuid NOT NULL REFERENCES users(id),
      uploaded_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (work_order_id, label),
      UNIQUE (id, work_order_id)
    );
    CREATE INDEX tune_versions_job_idx ON tune_versions (shop_id, work_order_id, uploaded_at);
    CREATE TRIGGER tune_versions_append_only BEFORE UPDATE OR DELETE ON tune_versions
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    ALTER TABLE dyno_runs
      ADD COLUMN tune_version_id uuid,
      ADD CONSTRAINT dyno_runs_tune_of_the_job FOREIGN KEY (tune_version_id, work_order_id)
        REFERENCES tune_versions (id, work_order_id);
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE dyno_runs DROP CONSTRAINT IF EXISTS dyno_runs_tune_of_the_job, DROP COLUMN IF EXISTS tune_version_id;
    DROP TABLE IF EXISTS tune_versions;
  `.execute(db);
}
