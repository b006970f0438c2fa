import type { ColumnType, Generated } from "kysely";
import type { Timestamp, Numeric, Json } from "./columns";

// Procedure templates: versions, steps and their specs (migration 2026_12_01_001_foundation).

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

export interface TemplateTables {
  procedure_templates: ProcedureTemplatesTable;
  template_versions: TemplateVersionsTable;
  template_steps: TemplateStepsTable;
  torque_specs: TorqueSpecsTable;
  measurement_specs: MeasurementSpecsTable;
  timer_specs: TimerSpecsTable;
}
