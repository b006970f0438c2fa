import type { Generated } from "kysely";
import type { ClockEndKind } from "@/lib/clock/spans";
import type { DefaultTimestamp, Timestamp } from "./columns";

// Time at the bench (migration 2026_12_05_091): clock-ons and the records that end them. Append-only.

interface BenchClocksTable {
  /** The tablet's clockId. */
  id: string;
  operation_id: string;
  shop_id: string;
  work_order_id: string;
  job_procedure_id: string | null;
  stage_key: string | null;
  mechanic_id: string;
  started_at: Timestamp;
  received_at: DefaultTimestamp;
}

interface BenchClockEndsTable {
  id: Generated<string>;
  clock_id: string;
  work_order_id: string;
  kind: ClockEndKind;
  ended_at: Timestamp;
  recorded_by: string;
  reason: string | null;
  /** The clock-off operation; null for a supervisor's close. */
  operation_id: string | null;
  recorded_at: DefaultTimestamp;
}

export interface ClockTables {
  bench_clocks: BenchClocksTable;
  bench_clock_ends: BenchClockEndsTable;
}
