import { sql, type Kysely } from "kysely";

// A flagged entry received after a job closed, on a stage whose sign-off was withdrawn or never
// made (the job handed over by override), has no sign-off a decision could accept it with: it is
// accepted on its own, with a written reason, and its row names no decision (`decision_id` NULL).
// Every acceptance made with a decision keeps naming it.

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`ALTER TABLE flag_acceptances ALTER COLUMN decision_id DROP NOT NULL`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE flag_acceptances DISABLE TRIGGER flag_acceptances_append_only;
    DELETE FROM flag_acceptances WHERE decision_id IS NULL;
    ALTER TABLE flag_acceptances ENABLE TRIGGER flag_acceptances_append_only;
    ALTER TABLE flag_acceptances ALTER COLUMN decision_id SET NOT NULL;
  `.execute(db);
}
