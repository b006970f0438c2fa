import { sql, type Kysely } from "kysely";

// A refund made at the payment provider (its dashboard) is recorded: how much of the payment went
// back (`refunded_minor`), and a payment refunded in full is 'refunded', so it no longer counts as
// paid anywhere (the deposit that lets a job into build, the deposits a bill takes off, the bill's
// balance).

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE deposits DROP CONSTRAINT deposits_status_check;
    ALTER TABLE deposits ADD CONSTRAINT deposits_status_check CHECK (status IN ('pending', 'paid', 'failed', 'refunded'));
    ALTER TABLE deposits ADD COLUMN refunded_minor bigint NOT NULL DEFAULT 0
      CONSTRAINT deposits_refunded_check CHECK (refunded_minor >= 0 AND refunded_minor <= amount_minor);
    ALTER TABLE balance_payments DROP CONSTRAINT balance_payments_status_check;
    ALTER TABLE balance_payments ADD CONSTRAINT balance_payments_status_check CHECK (status IN ('pending', 'paid', 'failed', 'refunded'));
    ALTER TABLE balance_payments ADD COLUMN refunded_minor bigint NOT NULL DEFAULT 0
      CONSTRAINT balance_payments_refunded_check CHECK (refunded_minor >= 0 AND refunded_minor <= amount_minor);
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE deposits DROP COLUMN refunded_minor;
    ALTER TABLE deposits DROP CONSTRAINT deposits_status_check;
    ALTER TABLE deposits ADD CONSTRAINT deposits_status_check CHECK (status IN ('pending', 'paid', 'failed'));
    ALTER TABLE balance_payments DROP COLUMN refunded_minor;
    ALTER TABLE balance_payments DROP CONSTRAINT balance_payments_status_check;
    ALTER TABLE balance_payments ADD CONSTRAINT balance_payments_status_check CHECK (status IN ('pending', 'paid', 'failed'));
  `.execute(db);
}
