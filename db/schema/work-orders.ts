import type { Generated } from "kysely";
import type { WorkOrderStatus } from "@/lib/work-orders/status";
import type { DefaultTimestamp, Timestamp } from "./columns";

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

export interface WorkOrderTables {
  work_orders: WorkOrdersTable;
  work_order_transitions: WorkOrderTransitionsTable;
  job_procedures: JobProceduresTable;
  attachments: AttachmentsTable;
}
