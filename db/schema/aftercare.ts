import type { Generated } from "kysely";
import type { ComeBackCause } from "@/lib/aftercare/come-backs";
import type { DateOnly, DefaultTimestamp } from "./columns";

// Come-backs and reminders after handover (migrations 2026_12_05_061, 062).

interface ComeBacksTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  original_work_order_id: string;
  rider_report: string;
  warranty_claimed: boolean;
  opened_by: string;
  opened_at: DefaultTimestamp;
}

interface ComeBackFindingsTable {
  id: Generated<string>;
  shop_id: string;
  come_back_id: string;
  under_warranty: boolean;
  cause: ComeBackCause;
  note: string;
  replaces_id: string | null;
  recorded_by: string;
  recorded_at: DefaultTimestamp;
}

interface RunInReminderLinesTable {
  id: Generated<string>;
  shop_id: string;
  template_id: string;
  position: number;
  label: string;
  after_days: number;
  after_km: number | null;
}

interface ServiceRemindersTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  label: string;
  due_on: DateOnly;
  due_odometer_km: number | null;
  from_line_id: string | null;
  created_by: string;
  created_at: DefaultTimestamp;
}

interface ServiceReminderDoneTable {
  id: Generated<string>;
  shop_id: string;
  reminder_id: string;
  note: string;
  odometer_km: number | null;
  recorded_by: string;
  recorded_at: DefaultTimestamp;
}

export interface AftercareTables {
  come_backs: ComeBacksTable;
  come_back_findings: ComeBackFindingsTable;
  run_in_reminder_lines: RunInReminderLinesTable;
  service_reminders: ServiceRemindersTable;
  service_reminder_done: ServiceReminderDoneTable;
}
