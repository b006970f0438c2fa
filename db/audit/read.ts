import "server-only";
import { sql, type Kysely } from "kysely";
import type { AuditEntry } from "@/lib/review/audit-csv";
import type { AuditRange } from "@/lib/review/audit-range";
import type { AuditFilter, AuditQuery } from "@/lib/review/list-queries";
import type { Database } from "../schema";

// Reading the append-only audit log of a shop: a page for the screen, and batches for the CSV
// export (keyset by id, so a long export never re-reads or skips rows while new ones arrive).
// Newest first is `id DESC` with no NULLS clause (id is never null), so the page walks the index
// (shop_id, id) backwards and stops after one page; a job is matched by its id, so the index
// (work_order_id, id) serves it. The count stops at COUNT_CAP: past it the screen says "more than".

/** The most entries the page counts; past it the total reads "more than 10,000". */
export const COUNT_CAP = 10_000;

/** An entry of the log with the names it refers to (see lib/review/audit-csv.ts). */
export type AuditRow = AuditEntry;

const SORT_SQL: Record<AuditQuery["sort"], string> = {
  at: "a.id",
  job: "w.number",
  actor: "u.name",
  action: "a.action",
  outcome: "a.outcome",
};

function where(shopId: string, f: AuditFilter, range?: AuditRange) {
  const parts = [sql`a.shop_id = ${shopId}::uuid`];
  if (f.job !== undefined)
    parts.push(sql`a.work_order_id = (SELECT id FROM work_orders WHERE shop_id = ${shopId}::uuid AND number = ${f.job})`);
  if (range) parts.push(sql`a.at >= ${range.from} AND a.at < ${range.until}`);
  if (f.outcome) parts.push(sql`a.outcome = ${f.outcome}`);
  if (f.action) parts.push(sql`a.action LIKE ${`${f.action.replace(/[\\%_]/g, (m) => `\\${m}`)}%`}`);
  if (f.q) {
    const like = `%${f.q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
    parts.push(
      sql`(u.name ILIKE ${like} OR u.email ILIKE ${like} OR a.device_id ILIKE ${like} OR a.reason ILIKE ${like} OR a.entity_id ILIKE ${like})`,
    );
  }
  return sql.join(parts, sql` AND `);
}

const from = sql`audit_log a LEFT JOIN work_orders w ON w.id = a.work_order_id AND w.shop_id = a.shop_id LEFT JOIN users u ON u.id = a.actor_id`;

type Raw = {
  id: string;
  at: Date;
  number: number | null;
  actor_name: string | null;
  actor_email: string | null;
  actor_role: string | null;
  device_id: string | null;
  action: string;
  entity: string;
  entity_id: string | null;
  outcome: "accepted" | "refused";
  reason: string | null;
  detail: Record<string, unknown>;
};
const columns = sql`a.id::text AS id, a.at, w.number, u.name AS actor_name, u.email AS actor_email, u.role AS actor_role, a.device_id,
  a.action, a.entity, a.entity_id, a.outcome, a.reason, a.detail`;

function row(r: Raw): AuditRow {
  return {
    id: r.id,
    at: r.at.toISOString(),
    workOrderNumber: r.number,
    actorName: r.actor_name,
    actorEmail: r.actor_email,
    actorRole: r.actor_role,
    deviceId: r.device_id,
    action: r.action,
    entity: r.entity,
    entityId: r.entity_id,
    outcome: r.outcome,
    reason: r.reason,
    detail: r.detail,
  };
}

/** One page of the log for the screen, and how many entries match, counted up to COUNT_CAP (`more`: there are more than that). */
export async function pageAuditLog(
  db: Kysely<Database>,
  shopId: string,
  q: AuditQuery,
): Promise<{ rows: AuditRow[]; total: number; more: boolean }> {
  const [count, rows] = await Promise.all([
    sql<{
      n: number;
    }>`SELECT count(*)::int AS n FROM (SELECT 1 FROM ${from} WHERE ${where(shopId, q)} LIMIT ${COUNT_CAP + 1}) capped`.execute(db),
    pageAuditLogSql(shopId, q).execute(db),
  ]);
  const n = count.rows[0]?.n ?? 0;
  return { total: Math.min(n, COUNT_CAP), more: n > COUNT_CAP, rows: rows.rows.map(row) };
}

/** ORDER BY of the page: by entry alone when sorted by time (the index's order), else by the column, then newest first. */
function pageOrder(q: Pick<AuditQuery, "sort" | "dir">) {
  const dir = q.dir === "asc" ? "ASC" : "DESC";
  return sql.raw(q.sort === "at" ? `a.id ${dir}` : `${SORT_SQL[q.sort]} ${dir} NULLS LAST, a.id DESC`);
}

/** The page's query, for EXPLAIN in tests and benchmarks. */
export function pageAuditLogSql(shopId: string, q: AuditQuery) {
  return sql<Raw>`SELECT ${columns} FROM ${from} WHERE ${where(shopId, q)} ORDER BY ${pageOrder(q)} LIMIT ${q.size} OFFSET ${q.page * q.size}`;
}

/** The matching entries in id order (oldest first), `batch` at a time; stops at the newest id there was when it started. */
export async function* auditLogBatches(
  db: Kysely<Database>,
  shopId: string,
  f: AuditFilter,
  range?: AuditRange,
  batch = 500,
): AsyncGenerator<AuditRow[]> {
  // The ids to walk: from the first entry of the range (found through the (shop_id, at) index, so a
  // month's download of a year's log does not read the eleven months before it) to the newest
  // entry there was when the download started.
  const bounds = await sql<{ first: string | null; last: string | null }>`
    SELECT (SELECT min(id) FROM audit_log WHERE shop_id = ${shopId}::uuid
              ${range ? sql`AND at >= ${range.from} AND at < ${range.until}` : sql``})::text AS first,
           (SELECT max(id) FROM audit_log WHERE shop_id = ${shopId}::uuid)::text AS last`.execute(db);
  const { first, last } = bounds.rows[0] ?? { first: null, last: null };
  if (!first || !last) return;
  let after = (BigInt(first) - 1n).toString();
  for (;;) {
    const r = await sql<Raw>`
      SELECT ${columns} FROM ${from}
      WHERE ${where(shopId, f, range)} AND a.id > ${after}::bigint AND a.id <= ${last}::bigint
      ORDER BY a.id LIMIT ${batch}
    `.execute(db);
    if (!r.rows.length) return;
    yield r.rows.map(row);
    after = r.rows[r.rows.length - 1].id;
    if (r.rows.length < batch) return;
  }
}
