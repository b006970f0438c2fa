import { sql, type Kysely } from "kysely";

// The e-mail outbox: every e-mail the app writes is first a row here, stored by the same request
// (or queue job) that causes it, then sent by a queue worker (app/_server/queue/). `cause` names
// what the e-mail is about (a quote, a deposit, a status move, a sign-off), so the same cause never
// queues the same e-mail to the same address twice. Each attempt is still written to
// outbound_emails (the append-only log of sends); this row carries the queue's working state.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE mail_outbox (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid REFERENCES work_orders(id),
      kind text NOT NULL CHECK (length(kind) BETWEEN 1 AND 40),
      cause text NOT NULL CHECK (length(cause) BETWEEN 1 AND 200),
      recipient text NOT NULL CHECK (length(recipient) BETWEEN 3 AND 320),
      subject text NOT NULL CHECK (length(subject) BETWEEN 1 AND 500),
      body text NOT NULL CHECK (length(body) <= 20000),
      attachment text CHECK (attachment IN ('handover_report')),
      state text NOT NULL DEFAULT 'queued' CHECK (state IN ('queued', 'sending', 'sent', 'failed')),
      attempts integer NOT NULL DEFAULT 0 CHECK (attempts >= 0),
      last_error text,
      message_id text,
      queued_at timestamptz NOT NULL DEFAULT now(),
      claimed_at timestamptz,
      sent_at timestamptz,
      CONSTRAINT mail_outbox_once UNIQUE (shop_id, cause, recipient),
      CONSTRAINT mail_outbox_sent_whole CHECK ((state = 'sent') = (sent_at IS NOT NULL))
    );
    CREATE INDEX mail_outbox_open_idx ON mail_outbox (shop_id, state, queued_at) WHERE state <> 'sent';
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`DROP TABLE IF EXISTS mail_outbox`.execute(db);
}
