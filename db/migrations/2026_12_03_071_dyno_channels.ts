import { sql, type Kysely } from "kysely";

// Logged channels on a dyno run (lib/dyno/channels.ts): each point may carry the mixture (lambda or
// air-fuel ratio), manifold boost, charge pressure before the intercooler, intake air temperature
// before and after the intercooler, ignition advance, knock retard, road speed and gear, stored as
// the file gave them; the unit and the file's column of each channel logged are kept per run, and
// the run names its fuel (for the stoichiometric ratio). A file imported through a column mapping is
// source 'mapped-csv'.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE dyno_runs
      ADD COLUMN fuel text CHECK (fuel IS NULL OR fuel IN ('petrol','E10','E85','methanol')),
      DROP CONSTRAINT dyno_runs_source_check,
      ADD CONSTRAINT dyno_runs_source_check CHECK (source IN ('table','csv','mapped-csv'));

    ALTER TABLE dyno_points
      ADD COLUMN mixture numeric,
      ADD COLUMN boost numeric,
      ADD COLUMN charge_pressure numeric,
      ADD COLUMN iat_before_cooler numeric,
      ADD COLUMN iat_after_cooler numeric,
      ADD COLUMN ignition numeric,
      ADD COLUMN knock_retard numeric,
      ADD COLUMN road_speed numeric,
      ADD COLUMN gear integer CHECK (gear IS NULL OR gear BETWEEN 0 AND 8);

    CREATE TABLE dyno_run_channels (
      run_id uuid NOT NULL REFERENCES dyno_runs(id) ON DELETE CASCADE,
      channel text NOT NULL CHECK (channel IN
        ('mixture','boost','chargePressure','iatBeforeCooler','iatAfterCooler','ignition','knockRetard','roadSpeed','gear')),
      unit text NOT NULL CHECK (length(unit) BETWEEN 1 AND 20),
      source_column text NOT NULL DEFAULT '' CHECK (length(source_column) <= 120),
      PRIMARY KEY (run_id, channel)
    );
    CREATE TRIGGER dyno_run_channels_append_only BEFORE UPDATE OR DELETE ON dyno_run_channels
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP TABLE IF EXISTS dyno_run_channels;
    ALTER TABLE dyno_points
      DROP COLUMN IF EXISTS mixture, DROP COLUMN IF EXISTS boost, DROP COLUMN IF EXISTS charge_pressure,
      DROP COLUMN IF EXISTS iat_before_cooler, DROP COLUMN IF EXISTS iat_after_cooler, DROP COLUMN IF EXISTS ignition,
      DROP COLUMN IF EXISTS knock_retard, DROP COLUMN IF EXISTS road_speed, DROP COLUMN IF EXISTS gear;
    ALTER TABLE dyno_runs DROP COLUMN IF EXISTS fuel,
      DROP CONSTRAINT dyno_runs_source_check,
      ADD CONSTRAINT dyno_runs_source_check CHECK (source IN ('table','csv'));
  `.execute(db);
}
