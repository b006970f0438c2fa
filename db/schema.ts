import type { ColumnType, Generated, Insertable, Selectable } from "kysely";
import type { DynoTables } from "./schema-dyno";
import type { OfficeTables } from "./schema-office";
import type { ReviewTables } from "./schema-review";

// Table types for Kysely. numeric columns come back from pg as strings (never silently rounded).
type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type Numeric = ColumnType<string, string | number, string | number>;
type Json<T = unknown> = ColumnType<T, string, string>;

export type Role = "mechanic" | "supervisor" | "office" | "customer";

export interface ShopsTable {
  id: Generated<string>;
  name: string;
  slug: string;
  time_zone: Generated<string>;
  torque_unit: Generated<"N·m" | "lbf·ft">;
  currency: Generated<string>;
  tax_rate_bp: Generated<number>;
  created_at: Generated<Timestamp>;
}

export interface CustomersTable {
  id: Generated<string>;
  shop_id: string;
  name: string;
  email: string | null;
  phone: string | null;
  notes: Generated<string>;
  created_at: Generated<Timestamp>;
  updated_at: Generated<Timestamp>;
}

export interface UsersTable {
  id: Generated<string>;
  shop_id: string;
  email: string;
  name: string;
  role: Role;
  password_hash: string;
  customer_id: string | null;
  active: Generated<boolean>;
  created_at: Generated<Timestamp>;
}

export interface BikesTable {
  id: Generated<string>;
  shop_id: string;
  customer_id: string;
  make: string;
  model: string;
  year: number | null;
  vin: string | null;
  engine_number: string | null;
  displacement_cc: number | null;
  colour: string | null;
  tag_code: string;
  notes: Generated<string>;
  created_at: Generated<Timestamp>;
}

export interface ProcedureTemplatesTable {
  id: Generated<string>;
  shop_id: string;
  key: string;
  name: string;
  created_at: Generated<Timestamp>;
}

export interface TemplateVersionsTable {
  id: Generated<string>;
  template_id: string;
  version: number;
  name: string;
  summary: Generated<string>;
  example_only: Generated<boolean>;
  created_by: string | null;
  created_at: Generated<Timestamp>;
}

export interface TemplateStepsTable {
  id: Generated<string>;
  template_version_id: string;
  stage_key: string;
  stage_title: string;
  stage_position: number;
  position: number;
  key: string;
  title: string;
  instructions: Generated<string>;
  cautions: Json<Array<{ kind: string; text: string }>>;
  requires_photo: Generated<boolean>;
  waits_for_step_key: string | null;
}

export interface TorqueSpecsTable {
  id: Generated<string>;
  step_id: string;
  label: string;
  final_value: Numeric;
  unit: "N·m" | "lbf·ft" | "lbf·in" | "kgf·m";
  passes: Json<Array<{ percent: number } | { value: number }>>;
  angle_passes: Json<number[]>;
  pattern: "cross" | "spiral-out" | "linear";
  bolt_count: number;
  lubricant: Generated<string>;
  torque_to_yield: Generated<boolean>;
}

export interface MeasurementSpecsTable {
  id: Generated<string>;
  step_id: string;
  key: string;
  label: string;
  nominal: Numeric | null;
  min: Numeric;
  max: Numeric;
  unit: "mm" | "in" | "µm";
  reading_labels: ColumnType<string[], string[] | undefined, string[]>;
  geometry: "bore" | "oil-clearance" | null;
}

export interface TimerSpecsTable {
  id: Generated<string>;
  step_id: string;
  label: string;
  duration_s: number;
  blocks_step_key: string | null;
}

export interface WorkOrdersTable {
  id: Generated<string>;
  shop_id: string;
  bike_id: string;
  number: number;
  title: string;
  status: string;
  complaint: Generated<string>;
  intake_odometer_km: number | null;
  assigned_mechanic_id: string | null;
  created_at: Generated<Timestamp>;
  updated_at: Generated<Timestamp>;
  closed_at: Timestamp | null;
}

export interface WorkOrderTransitionsTable {
  id: Generated<string>;
  work_order_id: string;
  from_status: string | null;
  to_status: string;
  by_user_id: string | null;
  note: Generated<string>;
  at: Generated<Timestamp>;
}

export interface JobProceduresTable {
  id: Generated<string>;
  work_order_id: string;
  template_version_id: string;
  position: number;
}

export interface OperationsTable {
  id: string;
  seq: Generated<string>;
  shop_id: string;
  work_order_id: string;
  kind: string;
  author_id: string;
  device_id: string;
  device_time: Timestamp;
  stamp: string;
  payload: Json<Record<string, unknown>>;
  flagged: Generated<boolean>;
  flag_reason: string | null;
  received_at: Generated<Timestamp>;
}

export interface StepCompletionsTable {
  id: string;
  work_order_id: string;
  step_id: string;
  completed_by: string;
  device_time: Timestamp;
  received_at: Generated<Timestamp>;
  flagged: Generated<boolean>;
  flag_reason: string | null;
}

export interface MeasurementsTable {
  id: string;
  work_order_id: string;
  step_id: string;
  spec_id: string;
  reading_index: Generated<number>;
  value: Numeric;
  unit: "mm" | "in" | "µm";
  verdict: "in" | "low" | "high";
  note: Generated<string>;
  supersedes_id: string | null;
  recorded_by: string;
  device_id: string;
  device_time: Timestamp;
  stamp: string;
  received_at: Generated<Timestamp>;
}

export interface TorqueRecordsTable {
  id: string;
  work_order_id: string;
  step_id: string;
  torque_spec_id: string;
  pass_index: number;
  bolt: number;
  wrench_reading: Numeric | null;
  wrench_unit: string | null;
  recorded_by: string;
  device_time: Timestamp;
  received_at: Generated<Timestamp>;
}

export interface TimersTable {
  id: string;
  work_order_id: string;
  step_id: string;
  timer_spec_id: string | null;
  label: string;
  duration_s: number;
  started_at: Timestamp;
  started_by: string;
  stopped_at: Timestamp | null;
  override_by: string | null;
  override_reason: string | null;
}

export interface SignOffsTable {
  id: string;
  work_order_id: string;
  job_procedure_id: string;
  stage_key: string;
  signed_by: string;
  device_time: Timestamp;
  received_at: Generated<Timestamp>;
}

export interface ReviewDecisionsTable {
  id: Generated<string>;
  sign_off_id: string;
  decision: "approved" | "sent_back";
  reason: Generated<string>;
  reopened_step_ids: ColumnType<string[], string[] | undefined, string[]>;
  decided_by: string;
  decided_at: Generated<Timestamp>;
  /** Place in the change sequence shared with operations.seq (set by a trigger; migration 002). */
  change_seq: Generated<number>;
}

export interface PartsFittedTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  step_id: string | null;
  part_number: string;
  description: Generated<string>;
  supplier: Generated<string>;
  serial: string | null;
  batch: string | null;
  quantity: Generated<number>;
  fitted_by: string | null;
  fitted_at: Generated<Timestamp>;
  /** The bench operation that recorded it; null when the office did (migration 006). */
  operation_id: Generated<string | null>;
}

export interface AttachmentsTable {
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
  created_at: Generated<Timestamp>;
  /** Queued on a tablet, bytes not uploaded yet (migration 002). */
  awaiting_upload: Generated<boolean>;
}

/** View: the current reading of each (job, spec, reading index) — latest stamp, not superseded (migration 002). */
export interface CurrentMeasurementsView {
  id: string;
  work_order_id: string;
  step_id: string;
  spec_id: string;
  reading_index: number;
  value: string;
  unit: "mm" | "in" | "µm";
  verdict: "in" | "low" | "high";
  note: string;
  supersedes_id: string | null;
  recorded_by: string;
  device_id: string;
  device_time: Date;
  stamp: string;
  received_at: Date;
  flagged: boolean;
  flag_reason: string | null;
}

export interface AuditLogTable {
  id: Generated<string>;
  shop_id: string | null;
  at: Generated<Timestamp>;
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

export interface SignInAttemptsTable {
  id: Generated<string>;
  key: string;
  succeeded: boolean;
  at: Generated<Timestamp>;
}

export interface Database extends DynoTables, OfficeTables, ReviewTables {
  shops: ShopsTable;
  customers: CustomersTable;
  users: UsersTable;
  bikes: BikesTable;
  procedure_templates: ProcedureTemplatesTable;
  template_versions: TemplateVersionsTable;
  template_steps: TemplateStepsTable;
  torque_specs: TorqueSpecsTable;
  measurement_specs: MeasurementSpecsTable;
  timer_specs: TimerSpecsTable;
  work_orders: WorkOrdersTable;
  work_order_transitions: WorkOrderTransitionsTable;
  job_procedures: JobProceduresTable;
  operations: OperationsTable;
  step_completions: StepCompletionsTable;
  measurements: MeasurementsTable;
  torque_records: TorqueRecordsTable;
  timers: TimersTable;
  sign_offs: SignOffsTable;
  review_decisions: ReviewDecisionsTable;
  parts_fitted: PartsFittedTable;
  attachments: AttachmentsTable;
  audit_log: AuditLogTable;
  sign_in_attempts: SignInAttemptsTable;
  current_measurements: CurrentMeasurementsView;
}

export type User = Selectable<UsersTable>;
export type NewAuditEntry = Insertable<AuditLogTable>;
