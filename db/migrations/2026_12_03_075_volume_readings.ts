import { sql, type Kysely } from "kysely";

// A measurement spec and its readings may be in cc (cm³) as well as a length unit: a combustion
// chamber is measured by the volume of liquid it takes (lib/calc/units.ts, MEASUREMENT_UNITS).
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE measurement_specs DROP CONSTRAINT measurement_specs_unit_check,
      ADD CONSTRAINT measurement_specs_unit_check CHECK (unit IN ('mm','in','µm','cc'));
    ALTER TABLE measurements DROP CONSTRAINT measurements_unit_check,
      ADD CONSTRAINT measurements_unit_check CHECK (unit IN ('mm','in','µm','cc'));
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE measurements DROP CONSTRAINT measurements_unit_check,
      ADD CONSTRAINT measurements_unit_check CHECK (unit IN ('mm','in','µm'));
    ALTER TABLE measurement_specs DROP CONSTRAINT measurement_specs_unit_check,
      ADD CONSTRAINT measurement_specs_unit_check CHECK (unit IN ('mm','in','µm'));
  `.execute(db);
}
