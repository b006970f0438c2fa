import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { CompiledQuery, type Kysely } from "kysely";
import type pg from "pg";
import { from as copyFrom } from "pg-copy-streams";

// Loading many rows by PostgreSQL's COPY (pg-copy-streams), through Kysely, inside whatever
// transaction the caller holds. Kysely hands a query's text and values to the pool's client; a
// client set up by `acceptCopyRows` (createDb does it for every connection) runs a text that
// starts with COPY_MARK as `COPY … FROM STDIN`, streaming its one value (the data, as an iterable
// of text chunks) to the server.

const COPY_MARK = "/* benchtag: copy from stdin */ ";

type QueryFn = (...args: unknown[]) => unknown;

/** Lets `client` run `copyRows` statements; every other query goes through unchanged. */
export function acceptCopyRows(client: pg.ClientBase): void {
  const query = client.query.bind(client) as QueryFn;
  (client as unknown as { query: QueryFn }).query = (text: unknown, ...rest: unknown[]) =>
    typeof text === "string" && text.startsWith(COPY_MARK) ? copyIn(query, text.slice(COPY_MARK.length), rest[0]) : query(text, ...rest);
}

async function copyIn(query: QueryFn, text: string, values: unknown) {
  const [data] = values as [Iterable<string>];
  const stream = query(copyFrom(text)) as ReturnType<typeof copyFrom>;
  await pipeline(Readable.from(data), stream);
  return { command: "COPY", rowCount: stream.rowCount, rows: [] };
}

const SPECIAL = /[\\\t\n\r]/;
const ESCAPES: Record<string, string> = { "\\": "\\\\", "\t": "\\t", "\n": "\\n", "\r": "\\r" };

/** A text in COPY's text format: backslash, tab, line feed and carriage return escaped (most texts hold none: no copy made). */
function copyText(text: string): string {
  return SPECIAL.test(text) ? text.replace(/[\\\t\n\r]/g, (c) => ESCAPES[c]) : text;
}

/** One value in COPY's text format: NULL as \N; objects as their JSON, dates as ISO, texts escaped. */
function copyValue(v: unknown): string {
  switch (typeof v) {
    case "string":
      return copyText(v);
    case "number":
    case "bigint":
      return String(v);
    case "boolean":
      return v ? "t" : "f";
    case "undefined":
      return "\\N";
    default:
      if (v === null) return "\\N";
      return copyText(v instanceof Date ? v.toISOString() : typeof v === "object" ? JSON.stringify(v) : String(v));
  }
}

/** Rows per chunk of COPY data: the server parses and stores one chunk while the next is being written. */
const CHUNK_ROWS = 250;

/** `rows` in COPY's text format, `CHUNK_ROWS` rows at a time, each made only when the stream asks for it. */
function* copyChunks(rows: readonly unknown[][]): Generator<string> {
  for (let start = 0; start < rows.length; start += CHUNK_ROWS) {
    let chunk = "";
    for (const row of rows.slice(start, start + CHUNK_ROWS)) {
      for (let i = 0; i < row.length; i++) chunk += (i ? "\t" : "") + copyValue(row[i]);
      chunk += "\n";
    }
    yield chunk;
  }
}

/**
 * COPY `rows` into `table` (`columns` in the rows' order): one round trip, no parameters, no JSON
 * to parse on the server. Objects go in as their JSON text (for json/jsonb columns), dates as ISO.
 * Runs on `db`'s connection, so in its transaction when `db` is one. The data is streamed in
 * chunks, so the server works on the first rows while the later ones are still being written.
 */
export async function copyRows(
  db: Pick<Kysely<unknown>, "executeQuery">,
  table: string,
  columns: readonly string[],
  rows: readonly unknown[][],
): Promise<void> {
  if (!rows.length) return;
  const name = (id: string) => `"${id.replaceAll('"', '""')}"`;
  await db.executeQuery(
    CompiledQuery.raw(`${COPY_MARK}COPY ${name(table)} (${columns.map(name).join(", ")}) FROM STDIN`, [copyChunks(rows)]),
  );
}
