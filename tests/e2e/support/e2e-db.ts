import pg from "pg";

// The database tests/e2e/serve.sh made for this run (fresh, seeded with the demo workshop).
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
