import bcrypt from "bcryptjs";
import pg from "pg";

// Direct access to the e2e database (the one tests/e2e/serve.sh seeds, fresh for each run): reading
// what the browser tests did, and set-up the product has no screen for yet — e.g. giving a customer
// created in the browser a sign-in.
export function e2eDatabaseUrl(): string {
  return process.env.E2E_DATABASE_URL ?? `postgres://benchtag@127.0.0.1:${process.env.BENCHTAG_TEST_PG_PORT ?? "54339"}/benchtag_e2e`;
}

export async function query<T extends pg.QueryResultRow = pg.QueryResultRow>(text: string, params: unknown[] = []): Promise<T[]> {
  const client = new pg.Client({ connectionString: e2eDatabaseUrl() });
  await client.connect();
  try {
    return (await client.query<T>(text, params)).rows;
  } finally {
    await client.end();
  }
}

export async function giveCustomerSignIn(email: string, password: string): Promise<void> {
  const c = new pg.Client({ connectionString: e2eDatabaseUrl() });
  await c.connect();
  try {
    const hash = await bcrypt.hash(password, 4);
    const r = await c.query(
      `INSERT INTO users (shop_id, email, name, role, password_hash, customer_id)
       SELECT shop_id, email, name, 'customer', $2, id FROM customers WHERE email = $1 RETURNING id`,
      [email, hash],
    );
    if (r.rowCount !== 1) throw new Error(`no single customer with e-mail ${email}`);
  } finally {
    await c.end();
  }
}
