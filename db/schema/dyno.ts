import type { ColumnType, Generated } from "kysely";
import type { PowerCorrectionStandard } from "@/lib/calc/power-correction";
import type { BoostUnit } from "@/lib/dyno/run-input";
import type { ShopTorqueUnit } from "@/lib/shop-units";
import type { DateOnly, DefaultTimestamp, Numeric } from "./columns";

// Table types for dyno runs (migrations 2026_12_02_004_dyno, 2026_12_02_007_dyno_withdrawals).

interface DynoRunsTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  label: string;
  ran_on: DateOnly;
  boost_target: Numeric;
  boost_unit: BoostUnit;
  pressure_kpa: Numeric;
  temperature_c: Numeric;
  humidity_percent: Numeric;
  correction_standard: PowerCorrectionStandard;
  torque_unit: ShopTorqueUnit;
  notes: Generated<string>;
  source: "table" | "csv";
  created_by: string | null;
  created_at: DefaultTimestamp;
  withdrawn_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
  withdrawn_by: string | null;
  withdrawn_reason: string | null;
}

interface DynoPointsTable {
  run_id: string;
  position: number;
  rpm: Numeric;
  torque: Numeric;
}

export interface DynoTables {
  dyno_runs: DynoRunsTable;
  dyno_points: DynoPointsTable;
}
