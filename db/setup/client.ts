import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import { databaseUrl } from "./config";
import { acceptCopyRows } from "./copy-rows";
import type { Database } from "../schema";

// bigint (int8) counts come back as strings by default; they are small here, so parse them.
pg.types.setTypeParser(20, (v) => Number.parseInt(v, 10));

/** The database handle every query function takes (a pool, or a transaction's Kysely). */
export type Db = Kysely<Database>;

/**
 * The server's pool gives up on a connection (a database that accepts it and never answers, or
 * a request waiting that long for a free one) after this long: the request then answers 503, try
 * again (./failures.ts), instead of hanging until the tablet gives up.
 */
export const CONNECT_TIMEOUT_MS = 30_000;

/**
 * A pool; `connectTimeoutMs` as above (none unless given: scripts and tests wait); JIT off. A connection
 * the database drops (a restart), idle or in use, is logged and replaced: without listeners the
 * error events would end the process.
 */
export function createDb(url = databaseUrl(), max = 10, opts: { connectTimeoutMs?: number } = {}): Kysely<Database> {
  const pool = new pg.Pool({
    connectionString: url,
    max,
    // No JIT compiling: the app's queries are short, and the planner's cost guess can cross the JIT
    // threshold on a small query (the review count compiled for 66 ms to run for 4)
    options: "-c jit=off",
    ...(opts.connectTimeoutMs ? { connectionTimeoutMillis: opts.connectTimeoutMs } : {}),
  });
  pool.on("error", (e) => console.error("[db] an idle connection was lost:", e.message));
  // a connection lost in the middle of a query fails that query (answered 503); the event it also
  // raises on the connection is logged here, not left to end the process
  pool.on("connect", (client) => {
    client.on("error", (e) => console.error("[db] a connection was lost:", e.message));
    acceptCopyRows(client);
  });
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
}

// One pool per server process (kept on globalThis so Next's dev reloads do not leak pools).
const g = globalThis as unknown as { __benchtagDb?: Kysely<Database> };
export function db(): Kysely<Database> {
  g.__benchtagDb ??= createDb(databaseUrl(), 10, { connectTimeoutMs: CONNECT_TIMEOUT_MS });
  return g.__benchtagDb;
}
