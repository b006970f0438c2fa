import { sql, type Kysely } from "kysely";

// Extra work found while in build, the customer's answer to each line, and the final bill.
// Every table here is append-only (a change is refused by benchtag_refuse_change): a supplement
// and its lines are never edited, a customer's answer to a line is given once, a link is used
// once (its use is a row of its own), an issued bill and its lines stay as issued.
// - supplements / supplement_lines: the office's supplementary quote (finding, parts and labour);
// - supplement_photos: the job's photos that show the finding;
// - supplement_decisions: one approve or decline per line, with the customer's comment, made by a
//   signed-in customer (decided_by) or through an e-mailed link (supplement_link_id);
// - supplement_links / supplement_link_uses: the one-time links (SHA-256 of the token, expiry,
//   the customer it was sent to) and their single use;
// - quote_declines: a customer's "no" to a whole quote, with their comment;
// - invoice_lines: the issued bill line by line (approved, declined, unanswered and added parts),
//   with labour billed as quoted or as clocked and both figures kept;
// - balance_payments: the customer's payment of the bill's balance through the payment service.
// Money on the bill is bigint (a bill with supplements can pass 2^31 minor units).
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE supplements (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      number integer NOT NULL CHECK (number BETWEEN 1 AND 999),
      finding text NOT NULL CHECK (length(finding) BETWEEN 3 AND 4000),
      currency text NOT NULL,
      created_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (work_order_id, number)
    );
    CREATE TABLE supplement_lines (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      supplement_id uuid NOT NULL REFERENCES supplements(id),
      position integer NOT NULL CHECK (position >= 0),
      kind text NOT NULL CHECK (kind IN ('part', 'labour')),
      description text NOT NULL CHECK (length(description) BETWEEN 2 AND 200),
      part_number text CHECK (part_number IS NULL OR length(part_number) BETWEEN 1 AND 60),
      quantity_hundredths integer NOT NULL CHECK (quantity_hundredths BETWEEN 1 AND 100000),
      unit_price_minor bigint NOT NULL CHECK (unit_price_minor BETWEEN 0 AND 100000000),
      line_total_minor bigint NOT NULL CHECK (line_total_minor >= 0),
      UNIQUE (supplement_id, position)
    );
    CREATE TABLE supplement_photos (
      supplement_id uuid NOT NULL REFERENCES supplements(id),
      attachment_id uuid NOT NULL REFERENCES attachments(id),
      PRIMARY KEY (supplement_id, attachment_id)
    );
    CREATE TABLE supplement_links (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      supplement_id uuid NOT NULL REFERENCES supplements(id),
      customer_id uuid NOT NULL REFERENCES customers(id),
      token_sha256 text NOT NULL UNIQUE CHECK (token_sha256 ~ '^[0-9a-f]{64}$'),
      expires_at timestamptz NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TABLE supplement_link_uses (
      link_id uuid PRIMARY KEY REFERENCES supplement_links(id),
      used_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TABLE supplement_decisions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      supplement_line_id uuid NOT NULL UNIQUE REFERENCES supplement_lines(id),
      decision text NOT NULL CHECK (decision IN ('approved', 'declined')),
      comment text NOT NULL DEFAULT '' CHECK (length(comment) <= 1000),
      decided_by uuid REFERENCES users(id),
      supplement_link_id uuid REFERENCES supplement_links(id),
      decided_at timestamptz NOT NULL DEFAULT now(),
      CHECK (decided_by IS NOT NULL OR supplement_link_id IS NOT NULL)
    );
    CREATE INDEX supplement_decisions_job_idx ON supplement_decisions (work_order_id);
    CREATE TABLE quote_declines (
      quote_id uuid PRIMARY KEY REFERENCES quotes(id),
      declined_by uuid NOT NULL REFERENCES users(id),
      comment text NOT NULL DEFAULT '' CHECK (length(comment) <= 1000),
      declined_at timestamptz NOT NULL DEFAULT now()
    );

    ALTER TABLE invoices
      ALTER COLUMN subtotal_minor TYPE bigint,
      ALTER COLUMN tax_minor TYPE bigint,
      ALTER COLUMN total_minor TYPE bigint,
      ALTER COLUMN deposits_paid_minor TYPE bigint,
      ALTER COLUMN balance_due_minor TYPE bigint,
      ADD COLUMN tax_rate_bp integer CHECK (tax_rate_bp BETWEEN 0 AND 10000),
      ADD COLUMN clocked_hundredths integer CHECK (clocked_hundredths >= 0);
    CREATE TABLE invoice_lines (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      invoice_id uuid NOT NULL REFERENCES invoices(id),
      position integer NOT NULL CHECK (position >= 0),
      source text NOT NULL CHECK (source IN ('quote', 'supplement', 'fitted_part')),
      quote_line_id uuid REFERENCES quote_lines(id),
      supplement_line_id uuid REFERENCES supplement_lines(id),
      part_fitted_id uuid REFERENCES parts_fitted(id),
      kind text NOT NULL CHECK (kind IN ('part', 'labour')),
      description text NOT NULL,
      part_number text,
      answer text NOT NULL CHECK (answer IN ('approved', 'declined', 'no_answer', 'added')),
      labour_basis text CHECK (labour_basis IN ('quoted', 'clocked')),
      quoted_hundredths integer NOT NULL CHECK (quoted_hundredths >= 0),
      clocked_hundredths integer CHECK (clocked_hundredths >= 0),
      quantity_hundredths integer NOT NULL CHECK (quantity_hundredths >= 0),
      unit_price_minor bigint NOT NULL CHECK (unit_price_minor >= 0),
      line_total_minor bigint NOT NULL CHECK (line_total_minor >= 0),
      counted boolean NOT NULL,
      UNIQUE (invoice_id, position),
      CHECK ((source = 'quote') = (quote_line_id IS NOT NULL)),
      CHECK ((source = 'supplement') = (supplement_line_id IS NOT NULL)),
      CHECK ((source = 'fitted_part') = (part_fitted_id IS NOT NULL)),
      CHECK (counted = (answer IN ('approved', 'added'))),
      CHECK ((labour_basis IS NOT NULL) = (kind = 'labour' AND counted))
    );
    CREATE TABLE balance_payments (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      invoice_id uuid NOT NULL REFERENCES invoices(id),
      amount_minor bigint NOT NULL CHECK (amount_minor > 0),
      currency text NOT NULL,
      payment_intent_id text UNIQUE,
      status text NOT NULL CHECK (status IN ('pending', 'paid', 'failed')),
      created_at timestamptz NOT NULL DEFAULT now(),
      paid_at timestamptz
    );
    CREATE UNIQUE INDEX balance_payments_one_open ON balance_payments (invoice_id) WHERE status IN ('pending', 'paid');

    CREATE TRIGGER supplements_append_only BEFORE UPDATE OR DELETE ON supplements FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
    CREATE TRIGGER supplement_lines_append_only BEFORE UPDATE OR DELETE ON supplement_lines FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
    CREATE TRIGGER supplement_photos_append_only BEFORE UPDATE OR DELETE ON supplement_photos FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
    CREATE TRIGGER supplement_links_append_only BEFORE UPDATE OR DELETE ON supplement_links FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
    CREATE TRIGGER supplement_link_uses_append_only BEFORE UPDATE OR DELETE ON supplement_link_uses FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
    CREATE TRIGGER supplement_decisions_append_only BEFORE UPDATE OR DELETE ON supplement_decisions FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
    CREATE TRIGGER quote_declines_append_only BEFORE UPDATE OR DELETE ON quote_declines FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
    CREATE TRIGGER invoice_lines_append_only BEFORE UPDATE OR DELETE ON invoice_lines FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP TABLE IF EXISTS balance_payments;
    DROP TABLE IF EXISTS invoice_lines;
    ALTER TABLE invoices DROP COLUMN IF EXISTS tax_rate_bp, DROP COLUMN IF EXISTS clocked_hundredths;
    DROP TABLE IF EXISTS quote_declines;
    DROP TABLE IF EXISTS supplement_decisions;
    DROP TABLE IF EXISTS supplement_link_uses;
    DROP TABLE IF EXISTS supplement_links;
    DROP TABLE IF EXISTS supplement_photos;
    DROP TABLE IF EXISTS supplement_lines;
    DROP TABLE IF EXISTS supplements;
  `.execute(db);
}
