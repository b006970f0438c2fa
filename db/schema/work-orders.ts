import type { Generated } from "kysely";
import type { OpenItem } from "@/lib/work-orders/open-items";
import type { WorkOrderStatus } from "@/lib/work-orders/status";
import type { DefaultTimestamp, Json, Timestamp } from "./columns";

// Work orders, their moves, pinned procedures and stored files (migrations 001, 002).

export interface WorkOrdersTable {
  id: Generated<string>;
  shop_id: string;
  bike_id: string;
  number: number;
  title: string;
  status: WorkOrderStatus;
  complaint: Generated<string>;
  intake_odometer_km: number | null;
  assigned_mechanic_id: string | null;
  created_at: DefaultTimestamp;
  updated_at: DefaultTimestamp;
  closed_at: Timestamp | null;
}

interface WorkOrderTransitionsTable {
  id: Generated<string>;
  work_order_id: string;
  from_status: WorkOrderStatus | null;
  to_status: WorkOrderStatus;
  by_user_id: string | null;
  note: Generated<string>;
  at: DefaultTimestamp;
}

interface JobProceduresTable {
  id: Generated<string>;
  work_order_id: string;
  template_version_id: string;
  position: number;
}

interface AttachmentsTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string | null;
  bike_id: string | null;
  step_id: string | null;
  purpose: "intake" | "teardown" | "step" | "reading" | "dyno" | "report";
  object_key: string;
  content_type: string;
  byte_size: number;
  caption: Generated<string>;
  uploaded_by: string | null;
  note_id: Generated<string | null>;
  created_at: DefaultTimestamp;
  /** Queued on a tablet, bytes not uploaded yet (migration 002). */
  awaiting_upload: Generated<boolean>;
  /** The bench operation that queued it; null for office photos (migration 030). */
  operation_id: Generated<string | null>;
}

/** The office moving a work order to ready or handed over with items open (append-only; migration 020). */
interface StatusOverridesTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  transition_id: string;
  from_status: WorkOrderStatus;
  to_status: "ready" | "handed_over";
  reason: string;
  /** The open items at that moment, as lib/work-orders/open-items.ts lists them. */
  open_items: Json<OpenItem[]>;
  by_user_id: string;
  at: DefaultTimestamp;
}

/** A stored copy of the build report: revision 1 at handover, then one per later accepted change (append-only; migration 020). */
interface ReportRevisionsTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  revision: number;
  handed_over: boolean;
  object_key: string;
  sha256: string;
  byte_size: number;
  /** The lines the report printed (compared with the next revision's to list what changed). */
  lines: Json<string[]>;
  /** What changed since the revision before (empty for revision 1). */
  changes: Json<string[]>;
  /** The accepted record it was made from (decisions and withdrawn runs; see app/_server/frozen-report.ts). */
  basis: string;
  made_by: string | null;
  made_at: DefaultTimestamp;
}

export interface WorkOrderTables {
  work_orders: WorkOrdersTable;
  work_order_transitions: WorkOrderTransitionsTable;
  job_procedures: JobProceduresTable;
  attachments: AttachmentsTable;
  status_overrides: StatusOverridesTable;
  report_revisions: ReportRevisionsTable;
}
