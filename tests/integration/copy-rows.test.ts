import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { copyRows } from "@/db/setup/copy-rows";
import { useTestDb } from "./support/test-db";

// COPY's text format on a real PostgreSQL: every value comes back as it went in, whatever it holds,
// and the rows land in the caller's transaction (rolled back with it).
const db = useTestDb();

const awkward = [
  "plain",
  "tab\there",
  "line\nfeed",
  "carriage\rreturn",
  "back\\slash",
  "\\N",
  "\\.",
  "",
  "ends with a backslash\\",
  "Ünïcödé µm ␀ 🔧",
  "\"quoted\" and 'single'",
];

describe("copyRows", () => {
  it("stores texts with tabs, line breaks, backslashes and COPY's own markers exactly, and null apart from an empty text", async () => {
    const got = await db.transaction().execute(async (trx) => {
      await sql`CREATE TEMPORARY TABLE copy_texts (n int, t text) ON COMMIT DROP`.execute(trx);
      await copyRows(trx, "copy_texts", ["n", "t"], [...awkward.map((t, n) => [n, t]), [awkward.length, null]]);
      return (await sql<{ n: number; t: string | null }>`SELECT n, t FROM copy_texts ORDER BY n`.execute(trx)).rows;
    });
    expect(got).toEqual([...awkward.map((t, n) => ({ n, t })), { n: awkward.length, t: null }]);
  });

  it("stores objects as JSON (with backslashes and line breaks inside), booleans, decimals as typed and times", async () => {
    const detail = { note: 'a\\b\n"c"\t', nested: { list: [1, "2", null] } };
    const got = await db.transaction().execute(async (trx) => {
      await sql`CREATE TEMPORARY TABLE copy_kinds (j jsonb, b boolean, d numeric, at timestamptz) ON COMMIT DROP`.execute(trx);
      await copyRows(
        trx,
        "copy_kinds",
        ["j", "b", "d", "at"],
        [
          [detail, true, "0.030", "2026-12-03T08:15:00.000Z"],
          [{}, false, "76.0100", new Date("2026-01-02T03:04:05.678Z")],
        ],
      );
      return (
        await sql<{
          j: unknown;
          b: boolean;
          d: string;
          at: string;
        }>`SELECT j, b, d::text AS d, to_char(at AT TIME ZONE 'UTC', 'YYYY-MM-DD HH24:MI:SS.MS') AS at
          FROM copy_kinds ORDER BY d`.execute(trx)
      ).rows;
    });
    expect(got).toEqual([
      { j: detail, b: true, d: "0.030", at: "2026-12-03 08:15:00.000" },
      { j: {}, b: false, d: "76.0100", at: "2026-01-02 03:04:05.678" },
    ]);
  });

  it("writes in the caller's transaction: a failure later in it leaves nothing behind", async () => {
    await sql`CREATE TABLE IF NOT EXISTS copy_kept (t text NOT NULL)`.execute(db);
    await expect(
      db.transaction().execute(async (trx) => {
        await copyRows(trx, "copy_kept", ["t"], [["first"], ["second"]]);
        expect((await sql<{ n: number }>`SELECT count(*)::int AS n FROM copy_kept`.execute(trx)).rows[0].n).toBe(2);
        throw new Error("stop here");
      }),
    ).rejects.toThrow("stop here");
    expect((await sql<{ n: number }>`SELECT count(*)::int AS n FROM copy_kept`.execute(db)).rows[0].n).toBe(0);
  });

  it("fails the statement (not the connection) on a value the column refuses, and the connection works on", async () => {
    await sql`CREATE TABLE IF NOT EXISTS copy_checked (n int NOT NULL CHECK (n > 0))`.execute(db);
    await expect(db.transaction().execute((trx) => copyRows(trx, "copy_checked", ["n"], [[1], [-1]]))).rejects.toThrow(/copy_checked/);
    expect((await sql<{ n: number }>`SELECT count(*)::int AS n FROM copy_checked`.execute(db)).rows[0].n).toBe(0);
    await db.transaction().execute((trx) => copyRows(trx, "copy_checked", ["n"], [[2], [3]]));
    expect((await sql<{ n: number }>`SELECT sum(n)::int AS n FROM copy_checked`.execute(db)).rows[0].n).toBe(5);
  });

  it("streams many rows in chunks: all of them land in order, and a refused row in an early chunk fails the statement and nothing of it stays", async () => {
    await sql`CREATE TABLE IF NOT EXISTS copy_many (n int NOT NULL CHECK (n <> 7), t text)`.execute(db);
    const rows = Array.from({ length: 2_000 }, (_, i) => [i + 10, `row ${i}\twith a tab`]);
    await expect(
      db.transaction().execute((trx) => copyRows(trx, "copy_many", ["n", "t"], [[1, "a"], [7, "refused"], ...rows])),
    ).rejects.toThrow(/copy_many/);
    expect((await sql<{ n: number }>`SELECT count(*)::int AS n FROM copy_many`.execute(db)).rows[0].n).toBe(0);
    await db.transaction().execute((trx) => copyRows(trx, "copy_many", ["n", "t"], rows));
    const got = await sql<{ n: number; t: string }>`SELECT n, t FROM copy_many ORDER BY n`.execute(db);
    expect(got.rows.map((r) => [r.n, r.t])).toEqual(rows);
  });
});
