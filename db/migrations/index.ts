import type { Migration } from "kysely";
import * as m001 from "./2026_12_01_001_foundation";
import * as m002 from "./2026_12_02_002_sync";
import * as m003 from "./2026_12_02_003_office";
import * as m004 from "./2026_12_02_004_dyno";
import * as m005 from "./2026_12_02_005_review";
import * as m006 from "./2026_12_02_006_bench_parts";
import * as m007 from "./2026_12_02_007_dyno_withdrawals";
import * as m050 from "./2026_12_03_050_sessions_and_sign_in_waits";
import * as m070 from "./2026_12_03_070_dyno_current_j1349";
import * as m071 from "./2026_12_03_071_dyno_channels";
import * as m072 from "./2026_12_03_072_tune_versions";
import * as m073 from "./2026_12_03_073_shop_presets";
import * as m074 from "./2026_12_03_074_build_sheets";
import * as m075 from "./2026_12_03_075_volume_readings";
import * as m040 from "./2026_12_03_040_sync_pending";
import * as m030 from "./2026_12_03_030_withdrawals_and_timer_reasons";
import * as m020 from "./2026_12_03_020_closed_record";
import * as m060 from "./2026_12_04_060_mail_outbox";
import * as m061 from "./2026_12_05_061_come_backs";
import * as m062 from "./2026_12_05_062_service_reminders";
import * as m063 from "./2026_12_05_063_calendar";
import * as m091 from "./2026_12_05_091_bench_clocks";
import * as m100 from "./2026_12_06_100_stock";
import * as m110 from "./2026_12_06_110_extra_work_and_bill";
import * as m120 from "./2026_12_06_120_customer_contact";
import * as m130 from "./2026_12_06_130_review_waiting";
import * as m140 from "./2026_12_06_140_merge_checked_references";
import * as m150 from "./2026_12_07_150_audit_log_statement_references";
import * as m151 from "./2026_12_07_151_operations_job_index";
import * as m160 from "./2026_12_08_160_quote_money_bigint";
import * as m170 from "./2026_12_09_170_stock_returned";
import * as m180 from "./2026_12_09_180_session_end_password_set";
import * as m190 from "./2026_12_10_190_payment_refunds";
import * as m200 from "./2026_12_11_200_handover_settlements";
import * as m210 from "./2026_12_11_210_money_to_give_back";
import * as m220 from "./2026_12_11_220_mail_stored_attachment";
import * as m230 from "./2026_12_12_230_flag_acceptance_on_its_own";

// Every migration, by name (run in name order by Kysely's Migrator). Add new files here.
// A static list works the same under tsx, vitest and the Next server, where a folder scan of
// .ts files would not.
export const migrations: Record<string, Migration> = {
  "2026_12_01_001_foundation": m001,
  "2026_12_02_002_sync": m002,
  "2026_12_02_003_office": m003,
  "2026_12_02_004_dyno": m004,
  "2026_12_02_005_review": m005,
  "2026_12_02_006_bench_parts": m006,
  "2026_12_02_007_dyno_withdrawals": m007,
  "2026_12_03_050_sessions_and_sign_in_waits": m050,
  "2026_12_03_070_dyno_current_j1349": m070,
  "2026_12_03_071_dyno_channels": m071,
  "2026_12_03_072_tune_versions": m072,
  "2026_12_03_073_shop_presets": m073,
  "2026_12_03_074_build_sheets": m074,
  "2026_12_03_075_volume_readings": m075,
  "2026_12_03_040_sync_pending": m040,
  "2026_12_03_030_withdrawals_and_timer_reasons": m030,
  "2026_12_03_020_closed_record": m020,
  "2026_12_04_060_mail_outbox": m060,
  "2026_12_05_061_come_backs": m061,
  "2026_12_05_062_service_reminders": m062,
  "2026_12_05_063_calendar": m063,
  "2026_12_05_091_bench_clocks": m091,
  "2026_12_06_100_stock": m100,
  "2026_12_06_110_extra_work_and_bill": m110,
  "2026_12_06_120_customer_contact": m120,
  "2026_12_06_130_review_waiting": m130,
  "2026_12_06_140_merge_checked_references": m140,
  "2026_12_07_150_audit_log_statement_references": m150,
  "2026_12_07_151_operations_job_index": m151,
  "2026_12_08_160_quote_money_bigint": m160,
  "2026_12_09_170_stock_returned": m170,
  "2026_12_09_180_session_end_password_set": m180,
  "2026_12_10_190_payment_refunds": m190,
  "2026_12_11_200_handover_settlements": m200,
  "2026_12_11_210_money_to_give_back": m210,
  "2026_12_11_220_mail_stored_attachment": m220,
  "2026_12_12_230_flag_acceptance_on_its_own": m230,
};
