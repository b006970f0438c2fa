import { sql, type Kysely } from "kysely";

// A dyno run recorded by mistake is withdrawn with a reason, never deleted: it stays on record,
// leaves the plot and the build report, and the withdrawal is in the audit log.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE dyno_runs
      ADD COLUMN withdrawn_at timestamptz,
      ADD COLUMN withdrawn_by uuid REFERENCES users(id),
      ADD COLUMN withdrawn_reason text CHECK (withdrawn_reason IS NULL OR length(withdrawn_reason) BETWEEN 5 AND 500),
      ADD CONSTRAINT dyno_runs_withdrawal_whole CHECK ((withdrawn_at IS NULL) = (withdrawn_reason IS NULL));
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE dyno_runs DROP CONSTRAINT IF EXISTS dyno_runs_withdrawal_whole,
      DROP COLUMN IF EXISTS withdrawn_reason, DROP COLUMN IF EXISTS withdrawn_by, DROP COLUMN IF EXISTS withdrawn_at;
  `.execute(db);
}
