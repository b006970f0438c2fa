import { sql, type Kysely } from "kysely";

// Things a shop saves by name to use again: a dyno CSV column mapping (lib/dyno/column-mapping.ts)
// and a compressor map outline copied from a maker's sheet (lib/calc/compressor-map.ts). Saving a
// name again adds a newer row; the newest row of a name is the one in use. Nothing is edited.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE shop_presets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      kind text NOT NULL CHECK (kind IN ('dyno-csv-mapping','compressor-map')),
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 80),
      body jsonb NOT NULL,
      created_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX shop_presets_name_idx ON shop_presets (shop_id, kind, name, created_at);
    CREATE TRIGGER shop_presets_append_only BEFORE UPDATE OR DELETE ON shop_presets
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`DROP TABLE IF EXISTS shop_presets;`.execute(db);
}
