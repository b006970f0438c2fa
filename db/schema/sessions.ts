import type { Generated } from "kysely";
import type { SessionEndReason } from "@/lib/auth/session-lifetime";
import type { Json, Timestamp, DefaultTimestamp } from "./columns";

// Server-side sessions, the office's clearing of sign-in waits and outbox hand-overs
// (migration 2026_12_03_050_sessions_and_sign_in_waits).

interface SessionsTable {
  id: Generated<string>;
  user_id: string;
  shop_id: string;
  device_id: string | null;
  client_address: Generated<string>;
  user_agent: Generated<string>;
  started_at: DefaultTimestamp;
  last_seen_at: DefaultTimestamp;
  idle_seconds: number;
  expires_at: Timestamp;
  absolute_expires_at: Timestamp;
  ended_at: Timestamp | null;
  ended_reason: SessionEndReason | null;
  ended_by: string | null;
}

interface SignInWaitsClearedTable {
  id: Generated<string>;
  key: string;
  shop_id: string;
  cleared_by: string;
  cleared_at: DefaultTimestamp;
}

interface OutboxHandoversTable {
  id: Generated<string>;
  shop_id: string;
  user_id: string;
  session_id: string;
  device_id: string;
  entry_count: number;
  photos_left: Json<unknown[]>;
  entries: Json<unknown[]>;
  received_at: DefaultTimestamp;
}

/** Which jobs a hand-over's entries were recorded on, and how many each (migration 200). */
interface OutboxHandoverJobsTable {
  handover_id: string;
  work_order_id: string;
  shop_id: string;
  entry_count: number;
  /** Photos of the job whose bytes never reached the server. */
  photo_count: Generated<number>;
}

/** The office's written settlement of a hand-over's entries on one job: it closes that open item (migration 200). */
interface OutboxHandoverSettlementsTable {
  id: Generated<string>;
  handover_id: string;
  work_order_id: string;
  shop_id: string;
  note: string;
  settled_by: string;
  settled_at: DefaultTimestamp;
}

export interface SessionTables {
  sessions: SessionsTable;
  sign_in_waits_cleared: SignInWaitsClearedTable;
  outbox_handovers: OutboxHandoversTable;
  outbox_handover_jobs: OutboxHandoverJobsTable;
  outbox_handover_settlements: OutboxHandoverSettlementsTable;
}
