import type { ColumnType, Generated } from "kysely";
import type { FuelId } from "@/lib/calc/fuels";
import type { PowerCorrectionStandard } from "@/lib/calc/power-correction";
import type { BoostUnit } from "@/lib/dyno/boost";
import type { ChannelId } from "@/lib/dyno/channels";
import type { ShopTorqueUnit } from "@/lib/shop-units";
import type { DateOnly, DefaultTimestamp, Json, Numeric } from "./columns";

// Table types for dyno runs, their logged channels, tune versions, shop presets and build sheets
// (migrations 2026_12_02_004_dyno, 2026_12_02_007_dyno_withdrawals, 2026_12_03_070 … 074).

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
  source: "table" | "csv" | "mapped-csv";
  created_by: string | null;
  created_at: DefaultTimestamp;
  withdrawn_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
  withdrawn_by: string | null;
  withdrawn_reason: string | null;
  fuel: ColumnType<FuelId | null, FuelId | null | undefined, FuelId | null>;
  tune_version_id: ColumnType<string | null, string | null | undefined, string | null>;
}

/** A logged channel value (numeric, as the file gave it); null where the point has none. */
type ChannelNumeric = ColumnType<string | null, string | number | null | undefined, string | number | null>;

interface DynoPointsTable {
  run_id: string;
  position: number;
  rpm: Numeric;
  torque: Numeric;
  // logged channels, one column each (snake_case of the channel id, lib/dyno/channels.ts)
  mixture: ChannelNumeric;
  boost: ChannelNumeric;
  charge_pressure: ChannelNumeric;
  iat_before_cooler: ChannelNumeric;
  iat_after_cooler: ChannelNumeric;
  ignition: ChannelNumeric;
  knock_retard: ChannelNumeric;
  road_speed: ChannelNumeric;
  gear: ColumnType<number | null, number | null | undefined, number | null>;
}

interface DynoRunChannelsTable {
  run_id: string;
  channel: ChannelId;
  unit: string;
  source_column: string;
}

interface TuneVersionsTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  label: string;
  notes: string;
  file_name: string;
  content_type: string;
  size_bytes: number;
  sha256: string;
  object_key: string;
  uploaded_by: string;
  uploaded_at: DefaultTimestamp;
}

interface ShopPresetsTable {
  id: Generated<string>;
  shop_id: string;
  kind: "dyno-csv-mapping" | "compressor-map";
  name: string;
  body: Json;
  created_by: string;
  created_at: DefaultTimestamp;
}

interface BuildSheetsTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  figures: Json;
  created_by: string;
  created_at: DefaultTimestamp;
}

export interface DynoTables {
  dyno_runs: DynoRunsTable;
  dyno_points: DynoPointsTable;
  dyno_run_channels: DynoRunChannelsTable;
  tune_versions: TuneVersionsTable;
  shop_presets: ShopPresetsTable;
  build_sheets: BuildSheetsTable;
}
