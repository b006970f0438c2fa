import { sql, type Kysely } from "kysely";

// Setting a new password (from an invitation link) ends the sign-in's other sessions: whoever held
// one of them (a shared computer, a stolen cookie) must sign in with the new password. Their end
// is recorded as 'password-set'.

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE sessions DROP CONSTRAINT sessions_ended_reason_check;
    ALTER TABLE sessions ADD CONSTRAINT sessions_ended_reason_check
      CHECK (ended_reason IN ('signed-out', 'ended-by-office', 'tablet-ended-by-office', 'user-turned-off', 'password-set'));
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE sessions DROP CONSTRAINT sessions_ended_reason_check;
    ALTER TABLE sessions ADD CONSTRAINT sessions_ended_reason_check
      CHECK (ended_reason IN ('signed-out', 'ended-by-office', 'tablet-ended-by-office', 'user-turned-off'));
  `.execute(db);
}
