import type { Generated } from "kysely";
import type { ToleranceStatus } from "@/lib/calc/tolerance";
import type { MeasurementUnit, TorqueUnit } from "@/lib/calc/units";
import type { OperationKind } from "@/lib/sync/operations";
import type { DefaultTimestamp, Json, Numeric, Timestamp } from "./columns";

// What the bench records: operations and the rows they write (migrations 001, 002, 006, 030).

interface OperationsTable {
  id: string;
  seq: Generated<string>;
  shop_id: string;
  work_order_id: string;
  kind: OperationKind;
  author_id: string;
  device_id: string;
  device_time: Timestamp;
  stamp: string;
  payload: Json<Record<string, unknown>>;
  flagged: Generated<boolean>;
  flag_reason: string | null;
  received_at: DefaultTimestamp;
}

interface StepCompletionsTable {
  id: string;
  work_order_id: string;
  step_id: string;
  completed_by: string;
  device_time: Timestamp;
  received_at: DefaultTimestamp;
  flagged: Generated<boolean>;
  flag_reason: string | null;
}

interface MeasurementsTable {
  id: string;
  work_order_id: string;
  step_id: string;
  spec_id: string;
  reading_index: Generated<number>;
  value: Numeric;
  unit: MeasurementUnit;
  verdict: ToleranceStatus;
  note: Generated<string>;
  supersedes_id: string | null;
  recorded_by: string;
  device_id: string;
  device_time: Timestamp;
  stamp: string;
  received_at: DefaultTimestamp;
}

interface TorqueRecordsTable {
  id: string;
  work_order_id: string;
  step_id: string;
  torque_spec_id: string;
  pass_index: number;
  bolt: number;
  wrench_reading: Numeric | null;
  wrench_unit: TorqueUnit | null;
  recorded_by: string;
  device_time: Timestamp;
  received_at: DefaultTimestamp;
}

interface TimersTable {
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
  /** When the override was made: the hold is released from then (migration 030). */
  override_at: Generated<Date | null>;
  stopped_by: Generated<string | null>;
  stop_reason: Generated<string | null>;
  /** A timer started by mistake: it no longer counts (migration 030). */
  cancelled_at: Generated<Date | null>;
  cancelled_by: Generated<string | null>;
  cancel_reason: Generated<string | null>;
}

/** An entry taken back by an `entry.withdrawn` operation: the entry stays, marked withdrawn (migration 030). */
interface WithdrawalsTable {
  id: string;
  work_order_id: string;
  operation_id: string;
  target_kind: OperationKind;
  withdrawn_by: string;
  reason: string;
  device_time: Timestamp;
  received_at: DefaultTimestamp;
}

interface SignOffsTable {
  id: string;
  work_order_id: string;
  job_procedure_id: string;
  stage_key: string;
  signed_by: string;
  device_time: Timestamp;
  received_at: DefaultTimestamp;
}

interface PartsFittedTable {
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
  fitted_at: DefaultTimestamp;
  /** The bench operation that recorded it; null when the office did (migration 006). */
  operation_id: Generated<string | null>;
}

/** View: the current reading of each (job, spec, reading index) — latest stamp, not superseded (migration 002). */
interface CurrentMeasurementsView {
  id: string;
  work_order_id: string;
  step_id: string;
  spec_id: string;
  reading_index: number;
  value: string;
  unit: MeasurementUnit;
  verdict: ToleranceStatus;
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

export interface BenchTables {
  operations: OperationsTable;
  step_completions: StepCompletionsTable;
  measurements: MeasurementsTable;
  torque_records: TorqueRecordsTable;
  timers: TimersTable;
  sign_offs: SignOffsTable;
  parts_fitted: PartsFittedTable;
  withdrawals: WithdrawalsTable;
  current_measurements: CurrentMeasurementsView;
}
