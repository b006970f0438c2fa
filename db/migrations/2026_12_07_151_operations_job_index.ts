import { sql, type Kysely } from "kysely";

// operations_job_idx was (work_order_id, stamp). Every query that reads a job's operations looks
// them up by work_order_id alone (db/review/detail.ts, db/review/flagged-work.ts) and orders them by
// seq or by `stamp COLLATE "C"`, which an index in the database's collation cannot serve. Keeping
// the stamp in the index cost the sync merge a collation-aware text comparison at every step down
// the tree for every operation it writes (about 50 ms of a 10,000-operation batch's COPY, measured
// as the best of six inserts of 10,000 rows). The index keeps the work order alone.

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE INDEX operations_work_order_idx ON operations (work_order_id);
    DROP INDEX operations_job_idx;
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE INDEX IF NOT EXISTS operations_job_idx ON operations (work_order_id, stamp);
    DROP INDEX IF EXISTS operations_work_order_idx;
  `.execute(db);
}
