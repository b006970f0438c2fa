import type { Migration } from "kysely";
import * as m001 from "./2026_12_01_001_foundation";
import * as m002 from "./2026_12_02_002_sync";
import * as m003 from "./2026_12_02_003_office";
import * as m004 from "./2026_12_02_004_dyno";
import * as m005 from "./2026_12_02_005_review";
import * as m006 from "./2026_12_02_006_bench_parts";
import * as m007 from "./2026_12_02_007_dyno_withdrawals";
import * as m020 from "./2026_12_03_020_closed_record";

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
  "2026_12_03_020_closed_record": m020,
};
