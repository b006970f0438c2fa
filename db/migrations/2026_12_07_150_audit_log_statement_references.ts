import { sql, type Kysely } from "kysely";

// The audit log's references (shop, actor, work order) checked once per statement instead of once
// per row. The sync merge appends one audit entry per operation it keeps, 10,000 in one COPY for a
// full batch; the three foreign keys ran 30,000 row-level checks for it (EXPLAIN ANALYZE of 10,000
// audit rows: about 60 % of the insert was the three constraint triggers).
//
// The same rule, for every writer of the log (the merge, the office, the review, the seed):
// - after each statement that adds entries, the shops, users and work orders they name are looked
//   up once each and locked FOR KEY SHARE, as a foreign key does (a concurrent delete waits, and
//   an entry naming a row deleted meanwhile fails); a missing one fails the statement with
//   SQLSTATE 23503 (foreign_key_violation), as the foreign key did;
// - deleting a shop, user or work order the log names, or changing its id, is refused (the
//   foreign key's NO ACTION side). Nothing in the application deletes them; this keeps the log
//   from ever pointing at nothing all the same.
// Also: the index (work_order_id, at) goes. A job's entries are read by (work_order_id, id)
// (db/audit/read.ts); the one query of a job's entries by time, its last assignment
// (db/sync/context.ts), gets a partial index holding only the assignments, which the merge's
// entries never enter. (shop_id, at) stays: the export finds a range's first entry through it.

const references = [
  { table: "shops", column: "shop_id", what: "a shop" },
  { table: "users", column: "actor_id", what: "a user" },
  { table: "work_orders", column: "work_order_id", what: "a work order" },
] as const;

// The trigger functions' bodies, one block per reference (names from the list above, no input).
const namedIds = references.map((r) => `${r.column}s uuid[];`).join("\n");
const collectIds = `SELECT ${references.map((r) => `array_agg(DISTINCT ${r.column}) FILTER (WHERE ${r.column} IS NOT NULL)`).join(", ")}
  INTO ${references.map((r) => `${r.column}s`).join(", ")} FROM added;`;
const checkIds = references
  .map(
    (r) => `IF ${r.column}s IS NOT NULL THEN
  PERFORM 1 FROM ${r.table} WHERE id = ANY(${r.column}s) FOR KEY SHARE;
  GET DIAGNOSTICS found = ROW_COUNT;
  IF found < cardinality(${r.column}s) THEN
    RAISE EXCEPTION 'audit_log names ${r.what} that does not exist' USING ERRCODE = 'foreign_key_violation';
  END IF;
END IF;`,
  )
  .join("\n");
const isNamed = references
  .map((r) => `IF TG_TABLE_NAME = '${r.table}' THEN named := EXISTS (SELECT 1 FROM audit_log WHERE ${r.column} = OLD.id); END IF;`)
  .join("\n");

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE audit_log
      DROP CONSTRAINT audit_log_shop_id_fkey,
      DROP CONSTRAINT audit_log_actor_id_fkey,
      DROP CONSTRAINT audit_log_work_order_id_fkey;

    -- After a statement adds entries: every shop, user and work order they name exists (locked as a foreign key locks it).
    CREATE FUNCTION benchtag_audit_log_references() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      ${sql.raw(namedIds)}
      found bigint;
    BEGIN
      ${sql.raw(collectIds)}
      ${sql.raw(checkIds)}
      RETURN NULL;
    END $$;
    CREATE TRIGGER audit_log_references AFTER INSERT ON audit_log
      REFERENCING NEW TABLE AS added FOR EACH STATEMENT EXECUTE FUNCTION benchtag_audit_log_references();

    -- A shop, user or work order the log names is never deleted, nor its id changed. Checked after the
    -- row is deleted or changed, as the foreign key's NO ACTION check is: an entry naming it that
    -- committed meanwhile (it held the row FOR KEY SHARE) is seen.
    CREATE FUNCTION benchtag_audit_log_referenced() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      named boolean := false;
    BEGIN
      ${sql.raw(isNamed)}
      IF named THEN
        RAISE EXCEPTION '% % is named by the audit log: % refused', TG_TABLE_NAME, OLD.id, TG_OP USING ERRCODE = 'foreign_key_violation';
      END IF;
      RETURN NULL;
    END $$;
  `.execute(db);
  for (const { table } of references) {
    await sql`
      CREATE TRIGGER ${sql.id(`${table}_audit_log_delete`)} AFTER DELETE ON ${sql.table(table)}
        FOR EACH ROW EXECUTE FUNCTION benchtag_audit_log_referenced();
      CREATE TRIGGER ${sql.id(`${table}_audit_log_id_change`)} AFTER UPDATE ON ${sql.table(table)}
        FOR EACH ROW WHEN (OLD.id IS DISTINCT FROM NEW.id) EXECUTE FUNCTION benchtag_audit_log_referenced();
    `.execute(db);
  }
  await sql`
    DROP INDEX audit_log_job_idx;
    CREATE INDEX audit_log_assign_idx ON audit_log (work_order_id, at) WHERE action = 'work_order.assign';
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP INDEX IF EXISTS audit_log_assign_idx;
    CREATE INDEX IF NOT EXISTS audit_log_job_idx ON audit_log (work_order_id, at);
  `.execute(db);
  for (const { table } of references) {
    await sql`
      DROP TRIGGER IF EXISTS ${sql.id(`${table}_audit_log_delete`)} ON ${sql.table(table)};
      DROP TRIGGER IF EXISTS ${sql.id(`${table}_audit_log_id_change`)} ON ${sql.table(table)};
    `.execute(db);
  }
  await sql`
    DROP TRIGGER IF EXISTS audit_log_references ON audit_log;
    DROP FUNCTION IF EXISTS benchtag_audit_log_references();
    DROP FUNCTION IF EXISTS benchtag_audit_log_referenced();
  `.execute(db);
  for (const { table, column } of references) {
    await sql`ALTER TABLE audit_log ADD CONSTRAINT ${sql.id(`audit_log_${column}_fkey`)} FOREIGN KEY (${sql.id(column)}) REFERENCES ${sql.table(table)}(id)`.execute(
      db,
    );
  }
}
