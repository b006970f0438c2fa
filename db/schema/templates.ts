import type { ColumnType, Generated } from "kysely";
import type { TorquePassSpec } from "@/lib/calc/torque-stages";
import type { MeasurementUnit, TorqueUnit } from "@/lib/calc/units";
import type { BoltPattern, CautionKind, MeasurementGeometry } from "@/lib/procedures/template-schema";
import type { DefaultTimestamp, Json, Numeric } from "./columns";

// Procedure templates: versions, steps and their specs (migration 2026_12_01_001_foundation).

interface ProcedureTemplatesTable {
  id: Generated<string>;
  shop_id: string;
  key: string;
  name: string;
  created_at: DefaultTimestamp;
}

interface TemplateVersionsTable {
  id: Generated<string>;
  template_id: string;
  version: number;
  name: string;
  summary: Generated<string>;
  example_only: Generated<boolean>;
  created_by: string | null;
  created_at: DefaultTimestamp;
}

interface TemplateStepsTable {
  id: Generated<string>;
  template_version_id: string;
  stage_key: string;
  stage_title: string;
  stage_position: number;
  position: number;
  key: string;
  title: string;
  instructions: Generated<string>;
  cautions: Json<Array<{ kind: CautionKind; text: string }>>;
  requires_photo: Generated<boolean>;
  waits_for_step_key: string | null;
}

interface TorqueSpecsTable {
  id: Generated<string>;
  step_id: string;
  label: string;
  final_value: Numeric;
  unit: TorqueUnit;
  passes: Json<TorquePassSpec[]>;
  angle_passes: Json<number[]>;
  pattern: BoltPattern;
  bolt_count: number;
  lubricant: Generated<string>;
  torque_to_yield: Generated<boolean>;
}

interface MeasurementSpecsTable {
  id: Generated<string>;
  step_id: string;
  key: string;
  label: string;
  nominal: Numeric | null;
  min: Numeric;
  max: Numeric;
  unit: MeasurementUnit;
  reading_labels: ColumnType<string[], string[] | undefined, string[]>;
  geometry: MeasurementGeometry | null;
}

interface TimerSpecsTable {
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
