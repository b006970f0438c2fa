import { sql, type Kysely } from "kysely";

// The "ready to collect" e-mail attaches the build report as it was stored when the job passed
// the gate (`attachment = 'stored_report'`, the object's key in `attachment_key`), not one made
// when the e-mail is sent: bench work arriving in between must not change what the customer gets.

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE mail_outbox ADD COLUMN attachment_key text;
    ALTER TABLE mail_outbox DROP CONSTRAINT mail_outbox_attachment_check;
    ALTER TABLE mail_outbox ADD CONSTRAINT mail_outbox_attachment_check CHECK (attachment IN ('handover_report', 'stored_report'));
    ALTER TABLE mail_outbox ADD CONSTRAINT mail_outbox_attachment_key_check
      CHECK ((attachment IS NOT DISTINCT FROM 'stored_report') = (attachment_key IS NOT NULL));
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE mail_outbox DROP CONSTRAINT mail_outbox_attachment_key_check;
    ALTER TABLE mail_outbox DROP CONSTRAINT mail_outbox_attachment_check;
    UPDATE mail_outbox SET attachment = 'handover_report' WHERE attachment = 'stored_report';
    ALTER TABLE mail_outbox ADD CONSTRAINT mail_outbox_attachment_check CHECK (attachment IN ('handover_report'));
    ALTER TABLE mail_outbox DROP COLUMN attachment_key;
  `.execute(db);
}
