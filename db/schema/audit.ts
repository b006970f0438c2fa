import type { ColumnType, Generated } from "kysely";
import type { DefaultTimestamp } from "./columns";

// The append-only audit log (migration 001).

export interface AuditLogTable {
  id: Generated<string>;
  shop_id: string | null;
  at: DefaultTimestamp;
  actor_id: string | null;
  device_id: string | null;
  action: string;
  entity: string;
  entity_id: string | null;
  work_order_id: string | null;
  outcome: "accepted" | "refused";
  reason: string | null;
  detail: ColumnType<Record<string, unknown>, string | undefined, never>;
}

export interface AuditTables {
  audit_log: AuditLogTable;
}
