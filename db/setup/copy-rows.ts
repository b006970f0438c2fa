import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { CompiledQuery, type Kysely } from "kysely";
import type pg from "pg";
import { from as copyFrom } from "pg-copy-streams";

// Loading many rows by PostgreSQL's COPY (pg-copy-streams), through Kysely, inside whatever
// transaction the caller holds. Kysely hands a query's text and values to the pool's client; a
// client set up by `acceptCopyRows` (createDb does it for every connection) runs a text that
// starts with COPY_MARK as `COPY … FROM STDIN`, streaming its one value as the data.

const COPY_MARK = "/* benchtag: copy from stdin */ ";

type QueryFn = (...args: unknown[]) => unknown;

/** Lets `client` run `copyRows` statements; every other query goes through unchanged. */
export function acceptCopyRows(client: pg.ClientBase): void {
  const query = client.query.bind(client) as QueryFn;
  (client as unknown as { query: QueryFn }).query = (text: unknown, ...rest: unknown[]) =>
    typeof text === "string" && text.startsWith(COPY_MARK) ? copyIn(query, text.slice(COPY_MARK.length), rest[0]) : query(text, ...rest);
}

async function copyIn(query: QueryFn, text: string, values: unknown) {
  const [data] = values as [string];
  const stream = query(copyFrom(text)) as ReturnType<typeof copyFrom>;
  await pipeline(Readable.from([Buffer.from(data, "utf8")]), stream);
  return { command: "COPY", rowCount: stream.rowCount, rows: [] };
}

/** One value in COPY's text format: NULL as \N; backslash, tab, line feed and carriage return escaped. */
function copyValue(v: unknown): string {
  if (v === null || v === undefined) return "\\N";
  if (typeof v === "boolean") return v ? "t" : "f";
  const text = typeof v === "string" ? v : v instanceof Date ? v.toISOString() : typeof v === "object" ? JSON.stringify(v) : String(v);
  return text.replace(/[\\\t\n\r]/g, (c) => (c === "\\" ? "\\\\" : c === "\t" ? "\\t" : c === "\n" ? "\\n" : "\\r"));
}

/**
 * COPY `rows` into `table` (`columns` in the rows' order): one round trip, no parameters, no JSON
 * to parse on the server. Objects go in as their JSON text (for json/jsonb columns), dates as ISO.
 * Runs on `db`'s connection, so in its transaction when `db` is one.
 */
export async function copyRows(
  db: Pick<Kysely<unknown>, "executeQuery">,
  table: string,
  columns: readonly string[],
  rows: readonly unknown[][],
): Promise<void> {
  if (!rows.length) return;
  const data = rows.map((r) => r.map(copyValue).join("\t")).join("\n") + "\n";
  const name = (id: string) => `"${id.replaceAll('"', '""')}"`;
  await db.executeQuery(CompiledQuery.raw(`${COPY_MARK}COPY ${name(table)} (${columns.map(name).join(", ")}) FROM STDIN`, [data]));
}
