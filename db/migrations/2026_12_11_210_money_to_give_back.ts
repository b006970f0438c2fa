import { sql, type Kysely } from "kysely";

// Money the payment provider took that the shop must give back, listed for the office until the
// provider reports the refund: a deposit or bill payment that went through after another payment
// had paid it, and a deposit paid after its job was closed. One row per payment intent; the
// refund the provider reports is kept on it (`given_back_minor`, `given_back_at` once in full).
// Those already on the audit log as "to be given back" are listed here too.

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE money_to_give_back (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      payment_for text NOT NULL CHECK (payment_for IN ('deposit', 'balance')),
      payment_id uuid NOT NULL,
      payment_intent_id text NOT NULL UNIQUE,
      amount_minor bigint NOT NULL CHECK (amount_minor > 0),
      currency text NOT NULL,
      reason text NOT NULL,
      recorded_at timestamptz NOT NULL DEFAULT now(),
      given_back_minor bigint NOT NULL DEFAULT 0 CHECK (given_back_minor >= 0 AND given_back_minor <= amount_minor),
      given_back_at timestamptz
    );
    CREATE INDEX money_to_give_back_open_idx ON money_to_give_back (shop_id, recorded_at) WHERE given_back_at IS NULL;
  `.execute(db);
  await backfillGiveBacks(db);
}

/** Lists the money already on the audit log as "to be given back" (run by `up`; exported for its test). */
export async function backfillGiveBacks(db: Kysely<unknown>): Promise<void> {
  await sql`
    -- with what went back already: on the payment's row (a paid one refunded), or, for one that did
    -- not count, in the refund events refused before this list existed (their audit detail)
    INSERT INTO money_to_give_back (shop_id, work_order_id, payment_for, payment_id, payment_intent_id, amount_minor, currency, reason,
      recorded_at, given_back_minor, given_back_at)
    SELECT DISTINCT ON (p.payment_intent_id) a.shop_id, p.work_order_id, p.payment_for, p.id, p.payment_intent_id, p.amount_minor, p.currency,
      CASE WHEN a.reason LIKE 'paid after the job was closed%' THEN 'Paid after the job was closed.'
        WHEN p.payment_for = 'deposit' THEN 'Taken after the deposit was paid by another payment.'
        ELSE 'Taken after the bill was paid by another payment.' END,
      a.at, back.minor, CASE WHEN back.minor = p.amount_minor THEN now() END
    FROM audit_log a
    JOIN (
      SELECT 'deposit' AS payment_for, id, work_order_id, amount_minor::bigint, currency, payment_intent_id, refunded_minor::bigint FROM deposits
      UNION ALL
      SELECT 'balance', id, work_order_id, amount_minor::bigint, currency, payment_intent_id, refunded_minor::bigint FROM balance_payments
    ) p ON p.id::text = a.entity_id AND a.entity = p.payment_for
    CROSS JOIN LATERAL (
      SELECT LEAST(p.amount_minor, GREATEST(p.refunded_minor, coalesce(max(
        CASE WHEN r.detail ->> 'amountRefunded' ~ '^[0-9]{1,15}$' THEN (r.detail ->> 'amountRefunded')::bigint END), 0))) AS minor
      FROM audit_log r
      WHERE r.entity = p.payment_for AND r.entity_id = p.id::text AND r.action = p.payment_for || '.refunded' AND r.outcome = 'refused'
        AND r.reason LIKE '%not paid'
    ) back
    WHERE a.action IN ('deposit.paid', 'balance.paid') AND a.reason LIKE '%to be given back'
      AND p.payment_intent_id IS NOT NULL AND p.amount_minor > 0
    ORDER BY p.payment_intent_id, a.id
    ON CONFLICT (payment_intent_id) DO NOTHING
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`DROP TABLE IF EXISTS money_to_give_back`.execute(db);
}
