import "server-only";
import { sql, type Kysely } from "kysely";
import type { AuditEntry } from "@/lib/review/audit-csv";
import type { AuditFilter, AuditQuery } from "@/lib/review/list-queries";
import type { Database } from "../schema";

// Reading the append-only audit log of a shop: a page for the screen, and batches for the CSV
// export (keyset by id, so a long export never re-reads or skips rows while new ones arrive).

/** An entry of the log with the names it refers to (see lib/review/audit-csv.ts). */
export type AuditRow = AuditEntry;

const SORT_SQL: Record<AuditQuery["sort"], string> = {
  at: "a.id",
  job: "w.number",
  actor: "u.name",
  action: "a.action",
  outcome: "a.outcome",
};

function where(shopId: string, f: AuditFilter) {
  const parts = [sql`a.shop_id = ${shopId}::uuid`];
  if (f.job !== undefined) parts.push(sql`w.number = ${f.job}`);
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

export async function pageAuditLog(db: Kysely<Database>, shopId: string, q: AuditQuery): Promise<{ rows: AuditRow[]; total: number }> {
  const order = sql.raw(`${SORT_SQL[q.sort]} ${q.dir === "asc" ? "ASC" : "DESC"} NULLS LAST, a.id DESC`);
  const [count, rows] = await Promise.all([
    sql<{ n: number }>`SELECT count(*)::int AS n FROM ${from} WHERE ${where(shopId, q)}`.execute(db),
    sql<Raw>`SELECT ${columns} FROM ${from} WHERE ${where(shopId, q)} ORDER BY ${order} LIMIT ${q.size} OFFSET ${q.page * q.size}`.execute(
      db,
    ),
  ]);
  return { total: count.rows[0]?.n ?? 0, rows: rows.rows.map(row) };
}

/** The matching entries in id order (oldest first), `batch` at a time; stops at the newest id there was when it started. */
export async function* auditLogBatches(db: Kysely<Database>, shopId: string, f: AuditFilter, batch = 500): AsyncGenerator<AuditRow[]> {
  const top = await sql<{ id: string | null }>`SELECT max(id)::text AS id FROM audit_log WHERE shop_id = ${shopId}::uuid`.execute(db);
  const last = top.rows[0]?.id;
  if (!last) return;
  let after = "0";
  for (;;) {
    const r = await sql<Raw>`
      SELECT ${columns} FROM ${from}
      WHERE ${where(shopId, f)} AND a.id > ${after}::bigint AND a.id <= ${last}::bigint
      ORDER BY a.id LIMIT ${batch}
    `.execute(db);
    if (!r.rows.length) return;
    yield r.rows.map(row);
    after = r.rows[r.rows.length - 1].id;
    if (r.rows.length < batch) return;
  }
}
