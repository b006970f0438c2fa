import "server-only";
import type { Kysely, Transaction } from "kysely";
import type { Database } from "../schema";

export interface AuditEntry {
  shopId: string | null;
  actorId: string | null;
  deviceId?: string | null;
  action: string;
  entity: string;
  entityId?: string | null;
  workOrderId?: string | null;
  outcome: "accepted" | "refused";
  reason?: string | null;
  detail?: Record<string, unknown>;
}

/** An entry as its audit_log row (detail as an object; the caller writes it as JSON). */
export function auditRow(e: AuditEntry) {
  return {
    shop_id: e.shopId,
    actor_id: e.actorId,
    device_id: e.deviceId ?? null,
    action: e.action,
    entity: e.entity,
    entity_id: e.entityId ?? null,
    work_order_id: e.workOrderId ?? null,
    outcome: e.outcome,
    reason: e.reason ?? null,
    detail: e.detail ?? {},
  };
}

// Appends to the audit log (the table refuses UPDATE and DELETE).
export async function appendAudit(db: Kysely<Database> | Transaction<Database>, entries: AuditEntry[]): Promise<void> {
  if (!entries.length) return;
  await db
    .insertInto("audit_log")
    .values(entries.map((e) => ({ ...auditRow(e), detail: JSON.stringify(e.detail ?? {}) })))
    .execute();
}
