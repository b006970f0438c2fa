import { sql, type Kysely } from "kysely";

// Dyno runs may be recorded under the current SAE J1349 form too (lib/calc/power-correction.ts,
// POWER_CORRECTION_STANDARD_IDS), beside the 1990 form.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE dyno_runs DROP CONSTRAINT dyno_runs_correction_standard_check;
    ALTER TABLE dyno_runs ADD CONSTRAINT dyno_runs_correction_standard_check
      CHECK (correction_standard IN ('SAE_J1349','SAE_J1349_CURRENT','DIN_70020','ISO_1585','SAE_J607'));
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE dyno_runs DROP CONSTRAINT dyno_runs_correction_standard_check;
    ALTER TABLE dyno_runs ADD CONSTRAINT dyno_runs_correction_standard_check
      CHECK (correction_standard IN ('SAE_J1349','DIN_70020','ISO_1585','SAE_J607'));
  `.execute(db);
}
