import { sql, type Kysely } from "kysely";

// A quote takes unit prices up to MAX_MINOR (lib/money/quote-totals.ts: 100 million in major
// units), as the bill does, but its money columns and the deposit's were integer: a line priced at
// 30,000,000.00 or a total past 21,474,836.47 failed the save as a server error. They are bigint,
// as the bill's have been since 2026_12_06_110 (pg reads bigint as a number: db/setup/client.ts;
// every amount stays within 2^53 because MAX_MINOR bounds the subtotal).

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE quotes
      ALTER COLUMN subtotal_minor TYPE bigint,
      ALTER COLUMN tax_minor TYPE bigint,
      ALTER COLUMN total_minor TYPE bigint,
      ALTER COLUMN deposit_minor TYPE bigint;
    ALTER TABLE quote_lines
      ALTER COLUMN unit_price_minor TYPE bigint,
      ALTER COLUMN line_total_minor TYPE bigint;
    ALTER TABLE deposits ALTER COLUMN amount_minor TYPE bigint;
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE deposits ALTER COLUMN amount_minor TYPE integer;
    ALTER TABLE quote_lines
      ALTER COLUMN unit_price_minor TYPE integer,
      ALTER COLUMN line_total_minor TYPE integer;
    ALTER TABLE quotes
      ALTER COLUMN subtotal_minor TYPE integer,
      ALTER COLUMN tax_minor TYPE integer,
      ALTER COLUMN total_minor TYPE integer,
      ALTER COLUMN deposit_minor TYPE integer;
  `.execute(db);
}
