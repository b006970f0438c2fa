import type { Role } from "@/lib/auth/roles";
import type { DefaultTimestamp, Json, Timestamp } from "./columns";

// The sync's own holding area (migration 040): operations waiting for the record they act on.

interface SyncPendingOperationsTable {
  id: string;
  shop_id: string;
  work_order_id: string;
  author_id: string;
  /** The author's role when it arrived (the rules are applied as they stood then). */
  author_role: Role;
  device_id: string;
  stamp: string;
  /** The whole operation, as checked by the wire format. */
  operation: Json<Record<string, unknown>>;
  target_kind: string;
  target_id: string;
  reason: string;
  /** The cursor of the batch it came in (what the tablet knew then). */
  batch_cursor: string | null;
  received_at: DefaultTimestamp;
  resolved_at: Timestamp | null;
  resolution: "applied" | "refused" | "discarded" | null;
}

export interface SyncTables {
  sync_pending_operations: SyncPendingOperationsTable;
}
