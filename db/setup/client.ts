import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import { databaseUrl } from "./config";
import type { Database } from "../schema";

// bigint (int8) counts come back as strings by default; they are small here, so parse them.
pg.types.setTypeParser(20, (v) => Number.parseInt(v, 10));

/** The database handle every query function takes (a pool, or a transaction's Kysely). */
export type Db = Kysely<Database>;

export function createDb(url = databaseUrl(), max = 10): Kysely<Database> {
  return new Kysely<Database>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: url, max }) }),
  });
}

// One pool per server process (kept on globalThis so Next's dev reloads do not leak pools).
const g = globalThis as unknown as { __benchtagDb?: Kysely<Database> };
export function db(): Kysely<Database> {
  g.__benchtagDb ??= createDb();
  return g.__benchtagDb;
}
