import { sql, type Kysely } from "kysely";

// The sync merge writes three rows per bench operation (the operation, its read-table row, its
// audit entry). Before this migration PostgreSQL checked about twelve foreign keys for each, every
// one repeating a check the merge has just made under the shop's sync lock (db/sync/merge.ts):
// the work order is in the user's shop, the author is the signed-in user, the step is on a
// procedure pinned on the job, the spec is the step's, the corrected reading or withdrawn entry is
// on file, the read-table row's id is the operation inserted beside it. These tables have no
// other writer in the application (the demo seed writes them once, from rows it has just read),
// and nothing deletes the rows they point at (shops, users, work orders, template steps and
// specs, job procedures are never deleted; operations become append-only below).
//
// Dropped: the foreign keys of operations, step_completions, measurements, torque_records,
// sign_offs and withdrawals, and operations' UNIQUE (seq) (seq is drawn from its sequence, never
// given; the change feed reads by (shop_id, seq), operations_shop_seq_idx).
// Kept: every primary key and UNIQUE that decides a race between writers (operations.id: once
// only, across shops too; withdrawals.operation_id: the first withdrawal stands), every CHECK,
// and every foreign key of a table with other writers or few rows: audit_log (every part of the
// application appends to it), review_decisions, timers, attachments, parts_fitted, bench_clocks,
// bench_clock_ends. The list and the reasons: lib/sync/README.md, "What PostgreSQL still checks".
//
// operations, step_completions and torque_records become append-only (as measurements, sign_offs
// and withdrawals already are): with the foreign keys gone, a trigger keeps an operation from
// being deleted from under the rows that name it.

const dropped: Record<string, Record<string, string>> = {
  operations: {
    operations_shop_id_fkey: "FOREIGN KEY (shop_id) REFERENCES shops(id)",
    operations_work_order_id_fkey: "FOREIGN KEY (work_order_id) REFERENCES work_orders(id)",
    operations_author_id_fkey: "FOREIGN KEY (author_id) REFERENCES users(id)",
    operations_seq_key: "UNIQUE (seq)",
  },
  step_completions: {
    step_completions_id_fkey: "FOREIGN KEY (id) REFERENCES operations(id)",
    step_completions_work_order_id_fkey: "FOREIGN KEY (work_order_id) REFERENCES work_orders(id)",
    step_completions_step_id_fkey: "FOREIGN KEY (step_id) REFERENCES template_steps(id)",
    step_completions_completed_by_fkey: "FOREIGN KEY (completed_by) REFERENCES users(id)",
  },
  measurements: {
    measurements_id_fkey: "FOREIGN KEY (id) REFERENCES operations(id)",
    measurements_work_order_id_fkey: "FOREIGN KEY (work_order_id) REFERENCES work_orders(id)",
    measurements_step_id_fkey: "FOREIGN KEY (step_id) REFERENCES template_steps(id)",
    measurements_spec_id_fkey: "FOREIGN KEY (spec_id) REFERENCES measurement_specs(id)",
    measurements_supersedes_id_fkey: "FOREIGN KEY (supersedes_id) REFERENCES measurements(id)",
    measurements_recorded_by_fkey: "FOREIGN KEY (recorded_by) REFERENCES users(id)",
  },
  torque_records: {
    torque_records_id_fkey: "FOREIGN KEY (id) REFERENCES operations(id)",
    torque_records_work_order_id_fkey: "FOREIGN KEY (work_order_id) REFERENCES work_orders(id)",
    torque_records_step_id_fkey: "FOREIGN KEY (step_id) REFERENCES template_steps(id)",
    torque_records_torque_spec_id_fkey: "FOREIGN KEY (torque_spec_id) REFERENCES torque_specs(id)",
    torque_records_recorded_by_fkey: "FOREIGN KEY (recorded_by) REFERENCES users(id)",
  },
  sign_offs: {
    sign_offs_id_fkey: "FOREIGN KEY (id) REFERENCES operations(id)",
    sign_offs_work_order_id_fkey: "FOREIGN KEY (work_order_id) REFERENCES work_orders(id)",
    sign_offs_job_procedure_id_fkey: "FOREIGN KEY (job_procedure_id) REFERENCES job_procedures(id)",
    sign_offs_signed_by_fkey: "FOREIGN KEY (signed_by) REFERENCES users(id)",
  },
  withdrawals: {
    withdrawals_id_fkey: "FOREIGN KEY (id) REFERENCES operations(id)",
    withdrawals_work_order_id_fkey: "FOREIGN KEY (work_order_id) REFERENCES work_orders(id)",
    withdrawals_operation_id_fkey: "FOREIGN KEY (operation_id) REFERENCES operations(id)",
    withdrawals_withdrawn_by_fkey: "FOREIGN KEY (withdrawn_by) REFERENCES users(id)",
  },
};

const madeAppendOnly = ["operations", "step_completions", "torque_records"];

export async function up(db: Kysely<unknown>): Promise<void> {
  for (const [table, constraints] of Object.entries(dropped)) {
    for (const name of Object.keys(constraints)) await sql`ALTER TABLE ${sql.table(table)} DROP CONSTRAINT ${sql.id(name)}`.execute(db);
  }
  for (const table of madeAppendOnly) {
    await sql`CREATE TRIGGER ${sql.id(`${table}_append_only`)} BEFORE UPDATE OR DELETE ON ${sql.table(table)}
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change()`.execute(db);
  }
}

export async function down(db: Kysely<unknown>): Promise<void> {
  for (const table of madeAppendOnly)
    await sql`DROP TRIGGER IF EXISTS ${sql.id(`${table}_append_only`)} ON ${sql.table(table)}`.execute(db);
  for (const [table, constraints] of Object.entries(dropped)) {
    for (const [name, definition] of Object.entries(constraints))
      await sql`ALTER TABLE ${sql.table(table)} ADD CONSTRAINT ${sql.id(name)} ${sql.raw(definition)}`.execute(db);
  }
}
