// Where the database is. DATABASE_URL wins (a managed server); otherwise the project's own
// cluster on 127.0.0.1 started by db/scripts/pg.sh (dev port 54329, database "benchtag").
export function databaseUrl(): string {
  if (process.env.DATABASE_URL) return process.env.DATABASE_URL;
  const port = process.env.BENCHTAG_PG_PORT ?? "54329";
  return `postgres://benchtag@127.0.0.1:${port}/benchtag`;
}
