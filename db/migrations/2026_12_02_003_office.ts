import { sql, type Kysely } from "kysely";

// Office side: intake and teardown notes, quotes with lines, deposits and the payment events
// already processed (replay guard), e-mails sent, final invoices. Money in integer minor units.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE work_order_notes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      kind text NOT NULL CHECK (kind IN ('intake','teardown','general')),
      body text NOT NULL,
      author_id uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX work_order_notes_job_idx ON work_order_notes (work_order_id, created_at);

    ALTER TABLE attachments ADD COLUMN note_id uuid REFERENCES work_order_notes(id);

    CREATE TABLE quotes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      version integer NOT NULL CHECK (version > 0),
      status text NOT NULL CHECK (status IN ('draft','sent','approved','superseded')),
      currency text NOT NULL,
      tax_rate_bp integer NOT NULL CHECK (tax_rate_bp >= 0),
      subtotal_minor integer NOT NULL DEFAULT 0 CHECK (subtotal_minor >= 0),
      tax_minor integer NOT NULL DEFAULT 0 CHECK (tax_minor >= 0),
      total_minor integer NOT NULL DEFAULT 0 CHECK (total_minor >= 0),
      deposit_minor integer NOT NULL DEFAULT 0 CHECK (deposit_minor >= 0),
      note text NOT NULL DEFAULT '',
      created_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      sent_at timestamptz,
      approved_at timestamptz,
      approved_by uuid REFERENCES users(id),
      UNIQUE (work_order_id, version),
      CHECK (deposit_minor <= total_minor)
    );

    CREATE TABLE quote_lines (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      quote_id uuid NOT NULL REFERENCES quotes(id) ON DELETE CASCADE,
      position integer NOT NULL,
      kind text NOT NULL CHECK (kind IN ('part','labour')),
      description text NOT NULL,
      part_number text,
      quantity_hundredths integer NOT NULL CHECK (quantity_hundredths > 0),
      unit_price_minor integer NOT NULL CHECK (unit_price_minor >= 0),
      line_total_minor integer NOT NULL CHECK (line_total_minor >= 0),
      UNIQUE (quote_id, position)
    );

    CREATE TABLE deposits (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      quote_id uuid NOT NULL REFERENCES quotes(id),
      amount_minor integer NOT NULL CHECK (amount_minor > 0),
      currency text NOT NULL,
      payment_intent_id text UNIQUE,
      status text NOT NULL CHECK (status IN ('pending','paid','failed')),
      created_at timestamptz NOT NULL DEFAULT now(),
      paid_at timestamptz
    );
    CREATE INDEX deposits_quote_idx ON deposits (quote_id);

    -- Every payment event accepted once: a second delivery of the same id is refused.
    CREATE TABLE payment_events (
      event_id text PRIMARY KEY,
      type text NOT NULL,
      payment_intent_id text,
      received_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE outbound_emails (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid REFERENCES work_orders(id),
      kind text NOT NULL,
      recipient text NOT NULL,
      subject text NOT NULL,
      message_id text,
      error text,
      sent_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX outbound_emails_job_idx ON outbound_emails (work_order_id, sent_at);

    CREATE TABLE invoices (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL UNIQUE REFERENCES work_orders(id),
      quote_id uuid NOT NULL REFERENCES quotes(id),
      number integer NOT NULL,
      currency text NOT NULL,
      subtotal_minor integer NOT NULL,
      tax_minor integer NOT NULL,
      total_minor integer NOT NULL,
      deposits_paid_minor integer NOT NULL,
      balance_due_minor integer NOT NULL,
      created_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (shop_id, number)
    );

    CREATE INDEX customers_search_idx ON customers (shop_id, lower(name));
    CREATE INDEX parts_fitted_part_idx ON parts_fitted (shop_id, part_number);
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP INDEX IF EXISTS parts_fitted_part_idx, customers_search_idx;
    DROP TABLE IF EXISTS invoices, outbound_emails, payment_events, deposits, quote_lines, quotes CASCADE;
    ALTER TABLE attachments DROP COLUMN IF EXISTS note_id;
    DROP TABLE IF EXISTS work_order_notes CASCADE;
  `.execute(db);
}
