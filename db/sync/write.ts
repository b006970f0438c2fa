import "server-only";
import { sql, type Transaction } from "kysely";
import type { Decision, MergeState } from "@/lib/sync/merge-rules";
import type { Operation, OperationKind } from "@/lib/sync/operations";
import { readingVerdict } from "@/lib/sync/readings";
import { auditRow, type AuditEntry } from "../audit/append";
import { copyRows } from "../setup/copy-rows";
import type { LoadedWorkOrder } from "./context";
import type { Database } from "../schema";

// Set-based writes for the merge: the kept operations, their read-table rows of the common kinds
// and the audit entries go straight into their tables by COPY; the rarer kinds and timer events as
// one JSON array per statement (INSERT … SELECT FROM json_to_recordset). A batch costs a fixed
// number of round trips whatever its size, and no statement runs into the 65,535-parameter
// limit. No row-at-a-time loop.

type Tx = Transaction<Database>;

// The column lists of these statements are keyed by the types they carry, so the compiler checks
// them: a recordset's columns by the row object, a payload field by the operation's payload type,
// an INSERT's target columns by the table type.
type PgType = "uuid" | "int" | "numeric" | "text" | "timestamptz" | "jsonb" | "boolean";

/** `json_to_recordset(...) AS x(<these>)`: every field of the row, with its PostgreSQL type. */
function recordset<R>(columns: { [K in keyof R]-?: PgType }) {
  return sql.raw(
    Object.entries(columns)
      .map(([name, type]) => `${name} ${type}`)
      .join(", "),
  );
}

/** A field of one operation kind's payload, read from the row's JSON as `type`. */
function payloadOf<K extends OperationKind>(_kind: K) {
  return (key: keyof Extract<Operation, { kind: K }>["payload"] & string, type: PgType) => sql.raw(`(x.payload->>'${key}')::${type}`);
}

/** `table (col, …)` for an INSERT, the columns checked against the table's type. */
function into<T extends keyof Database>(table: T, columns: ReadonlyArray<keyof Database[T] & string>) {
  return sql.raw(`${table} (${columns.join(", ")})`);
}

export interface KeptOperation {
  op: Operation;
  decision: Extract<Decision, { outcome: "accept" | "flag" }>;
}

const flagReason = (k: KeptOperation) => (k.decision.outcome === "flag" ? k.decision.reason : null);

/**
 * Takes the shop's sync lock (held until the transaction ends): merges in a shop run one at a time.
 * Any other code that inserts operations must take it first too (review decisions take it by trigger).
 * Also gives the merge enough sort memory to keep a 10,000-operation batch off the disk, and turns
 * off JIT compilation for it: a large batch's estimates pass JIT's threshold, and compiling the
 * earlier single write statement took about half a second at 10,000 operations (EXPLAIN ANALYZE).
 */
export async function lockShopForSync(trx: Tx, shopId: string): Promise<void> {
  await sql`SELECT benchtag_lock_shop_sync(${shopId}::uuid), set_config('work_mem', '64MB', true), set_config('jit', 'off', true)`.execute(
    trx,
  );
}

/** COPY rows into `table`, each row keyed by the table's column names (the compiler checks them). */
function copyInto<T extends keyof Database & string, C extends keyof Database[T] & string>(
  trx: Tx,
  table: T,
  columns: readonly C[],
  rows: readonly { [K in C]: unknown }[],
): Promise<void> {
  return copyRows(
    trx,
    table,
    columns,
    rows.map((row) => columns.map((c) => row[c])),
  );
}

const AUDIT_COLUMNS = [
  "shop_id",
  "actor_id",
  "device_id",
  "action",
  "entity",
  "entity_id",
  "work_order_id",
  "outcome",
  "reason",
  "detail",
] as const satisfies readonly (keyof ReturnType<typeof auditRow>)[];

/**
 * Writes the kept operations (in stamp order; the decisions have checked every reference they
 * make, under the shop lock): `operations`, the read tables and the audit log, each by COPY
 * (one round trip per table, no JSON to parse on the server), then the rarer kinds in one
 * statement (`writeOtherKinds`) and timer stops and cancels in another. `operations` is written
 * first and in stamp order, so seq (the sync cursor) follows the stamps.
 *
 * All of it goes in, or the transaction fails: an id stored meanwhile by a merge that does not
 * share this one's lock (another shop's; within a shop the lock orders merges) is refused by the
 * primary key, nothing is saved and the tablet sends again (it is then told the id is taken).
 * The references of `operations` and the read tables are checked by the merge, not by foreign
 * keys (lib/sync/README.md, "What PostgreSQL still checks"). Overrides are settled after, by
 * stamp (`applyFirstOverrides`).
 *
 * Each row is audited under its own author: a held operation applied now was sent by its author,
 * perhaps from another tablet, not by whoever brought the record it waited for.
 */
export async function writeKept(
  trx: Tx,
  shopId: string,
  kept: readonly KeptOperation[],
  jobs: ReadonlyMap<string, LoadedWorkOrder>,
  state: MergeState,
): Promise<void> {
  if (!kept.length) return;
  await copyInto(
    trx,
    "operations",
    ["id", "shop_id", "work_order_id", "kind", "author_id", "device_id", "device_time", "stamp", "payload", "flagged", "flag_reason"],
    kept.map(({ op, decision }) => ({
      id: op.id,
      shop_id: shopId,
      work_order_id: op.workOrderId,
      kind: op.kind,
      author_id: op.authorId,
      device_id: op.deviceId,
      device_time: op.deviceTime,
      stamp: op.stamp,
      payload: op.payload,
      flagged: decision.outcome === "flag",
      flag_reason: flagReason({ op, decision }),
    })),
  );

  const completions: StepCompletionRow[] = [];
  const readings: MeasurementRow[] = [];
  const bolts: TorqueRecordRow[] = [];
  const others: KeptOperation[] = [];
  for (const k of kept) {
    const { op } = k;
    if (op.kind === "step.completed") {
      completions.push({
        id: op.id,
        work_order_id: op.workOrderId,
        step_id: op.payload.stepId,
        completed_by: op.authorId,
        device_time: op.deviceTime,
        flagged: k.decision.outcome === "flag",
        flag_reason: flagReason(k),
      });
    } else if (op.kind === "measurement.recorded") {
      const p = op.payload;
      readings.push({
        id: op.id,
        work_order_id: op.workOrderId,
        step_id: p.stepId,
        spec_id: p.specId,
        reading_index: p.readingIndex,
        // the decimal text typed: numeric keeps its scale ("0.030" stays "0.030")
        value: p.value,
        unit: p.unit,
        verdict: readingVerdict(p.value, p.unit, jobs.get(op.workOrderId)!.measurementSpecs.get(p.specId)!),
        note: p.note ?? "",
        supersedes_id: p.supersedesId ?? null,
        recorded_by: op.authorId,
        device_id: op.deviceId,
        device_time: op.deviceTime,
        stamp: op.stamp,
      });
    } else if (op.kind === "torque.bolt-confirmed") {
      const p = op.payload;
      bolts.push({
        id: op.id,
        work_order_id: op.workOrderId,
        step_id: p.stepId,
        torque_spec_id: p.torqueSpecId,
        pass_index: p.passIndex,
        bolt: p.bolt,
        wrench_reading: p.wrenchReading ?? null,
        wrench_unit: p.wrenchUnit ?? null,
        recorded_by: op.authorId,
        device_time: op.deviceTime,
      });
    } else others.push(k);
  }
  await copyInto(trx, "step_completions", STEP_COMPLETION_COLUMNS, completions);
  await copyInto(trx, "measurements", MEASUREMENT_COLUMNS, readings);
  await copyInto(trx, "torque_records", TORQUE_RECORD_COLUMNS, bolts);
  await writeOtherKinds(trx, shopId, others, jobs, state);
  await copyInto(
    trx,
    "audit_log",
    AUDIT_COLUMNS,
    kept.map((k) =>
      auditRow({
        shopId,
        actorId: k.op.authorId,
        deviceId: k.op.deviceId,
        action: `sync.${k.op.kind}`,
        entity: "operation",
        entityId: k.op.id,
        workOrderId: k.op.workOrderId,
        outcome: "accepted",
        reason: flagReason(k),
        detail: { stamp: k.op.stamp, flagged: k.decision.outcome === "flag" },
      }),
    ),
  );
  await writeTimerEvents(
    trx,
    kept.map((k) => k.op),
  );
}

const STEP_COMPLETION_COLUMNS = ["id", "work_order_id", "step_id", "completed_by", "device_time", "flagged", "flag_reason"] as const;
type StepCompletionRow = { [K in (typeof STEP_COMPLETION_COLUMNS)[number]]: unknown };
const MEASUREMENT_COLUMNS = [
  "id",
  "work_order_id",
  "step_id",
  "spec_id",
  "reading_index",
  "value",
  "unit",
  "verdict",
  "note",
  "supersedes_id",
  "recorded_by",
  "device_id",
  "device_time",
  "stamp",
] as const;
type MeasurementRow = { [K in (typeof MEASUREMENT_COLUMNS)[number]]: unknown };
const TORQUE_RECORD_COLUMNS = [
  "id",
  "work_order_id",
  "step_id",
  "torque_spec_id",
  "pass_index",
  "bolt",
  "wrench_reading",
  "wrench_unit",
  "recorded_by",
  "device_time",
] as const;
type TorqueRecordRow = { [K in (typeof TORQUE_RECORD_COLUMNS)[number]]: unknown };

/**
 * The read-table rows of the rarer kinds (timers, photos, sign-offs, parts, withdrawals, clocks),
 * few per batch, in one statement taking them as one JSON array: data-modifying CTEs, one per
 * table. A withdrawal goes in only if it is the first of its entry (`ON CONFLICT (operation_id)`).
 */
async function writeOtherKinds(
  trx: Tx,
  shopId: string,
  kept: readonly KeptOperation[],
  jobs: ReadonlyMap<string, LoadedWorkOrder>,
  state: MergeState,
): Promise<void> {
  if (!kept.length) return;
  const rows = kept.map(({ op }, ord) => ({
    ord,
    id: op.id,
    work_order_id: op.workOrderId,
    kind: op.kind,
    author_id: op.authorId,
    device_time: op.deviceTime,
    payload: op.payload,
    bike_id: op.kind === "photo.queued" ? jobs.get(op.workOrderId)!.bikeId : null,
    target_kind: op.kind === "entry.withdrawn" ? (state.entries.get(op.payload.operationId)?.kind ?? null) : null,
  }));
  const columns = recordset<(typeof rows)[number]>({
    ord: "int",
    id: "uuid",
    work_order_id: "uuid",
    kind: "text",
    author_id: "uuid",
    device_time: "timestamptz",
    payload: "jsonb",
    bike_id: "uuid",
    target_kind: "text",
  });
  const timer = payloadOf("timer.started");
  const photo = payloadOf("photo.queued");
  const signOff = payloadOf("stage.signed-off");
  const part = payloadOf("part.fitted");
  const withdrawal = payloadOf("entry.withdrawn");
  const clockOn = payloadOf("clock.on");
  const clockOff = payloadOf("clock.off");
  await sql`
    WITH y AS MATERIALIZED (
      SELECT * FROM json_to_recordset(${JSON.stringify(rows)}::json) AS x(${columns})
    ),
    timer_starts AS (
      INSERT INTO ${into("timers", ["id", "work_order_id", "step_id", "timer_spec_id", "label", "duration_s", "started_at", "started_by"])}
      SELECT ${timer("timerId", "uuid")}, x.work_order_id, ${timer("stepId", "uuid")}, ${timer("timerSpecId", "uuid")}, ${timer("label", "text")},
        ${timer("durationS", "int")}, ${timer("startedAt", "timestamptz")}, x.author_id
      FROM y x WHERE x.kind = 'timer.started'
    ),
    photos AS (
      INSERT INTO ${into("attachments", ["id", "shop_id", "work_order_id", "bike_id", "step_id", "purpose", "object_key", "content_type", "byte_size", "caption", "uploaded_by", "awaiting_upload", "operation_id"])}
      SELECT ${photo("attachmentId", "uuid")}, ${shopId}::uuid, x.work_order_id, x.bike_id, ${photo("stepId", "uuid")}, 'step',
        'shops/' || ${shopId}::text || '/work-orders/' || x.work_order_id || '/photos/' || ${photo("attachmentId", "text")},
        ${photo("contentType", "text")}, ${photo("byteSize", "int")}, COALESCE(${photo("caption", "text")}, ''), x.author_id, true, x.id
      FROM y x WHERE x.kind = 'photo.queued'
    ),
    sign_offs AS (
      INSERT INTO ${into("sign_offs", ["id", "work_order_id", "job_procedure_id", "stage_key", "signed_by", "device_time"])}
      SELECT x.id, x.work_order_id, ${signOff("jobProcedureId", "uuid")}, ${signOff("stageKey", "text")}, x.author_id, x.device_time
      FROM y x WHERE x.kind = 'stage.signed-off'
    ),
    parts AS (
      INSERT INTO ${into("parts_fitted", ["id", "shop_id", "work_order_id", "step_id", "part_number", "description", "supplier", "serial", "batch", "quantity", "fitted_by", "fitted_at", "operation_id"])}
      SELECT ${part("partFittedId", "uuid")}, ${shopId}::uuid, x.work_order_id, ${part("stepId", "uuid")}, ${part("partNumber", "text")},
        ${part("description", "text")}, COALESCE(${part("supplier", "text")}, ''), ${part("serial", "text")}, ${part("batch", "text")},
        ${part("quantity", "int")}, x.author_id, x.device_time, x.id
      FROM y x WHERE x.kind = 'part.fitted'
    ),
    withdrawn AS (
      -- the first withdrawal of an entry stands; later ones stay in the operations and the audit log
      INSERT INTO ${into("withdrawals", ["id", "work_order_id", "operation_id", "target_kind", "withdrawn_by", "reason", "device_time"])}
      SELECT DISTINCT ON (${withdrawal("operationId", "uuid")}) x.id, x.work_order_id, ${withdrawal("operationId", "uuid")}, x.target_kind,
        x.author_id, ${withdrawal("reason", "text")}, x.device_time
      FROM y x WHERE x.kind = 'entry.withdrawn'
      ORDER BY ${withdrawal("operationId", "uuid")}, x.ord
      ON CONFLICT (operation_id) DO NOTHING
    ),
    clocks_on AS (
      INSERT INTO ${into("bench_clocks", ["id", "operation_id", "shop_id", "work_order_id", "job_procedure_id", "stage_key", "mechanic_id", "started_at"])}
      SELECT ${clockOn("clockId", "uuid")}, x.id, ${shopId}::uuid, x.work_order_id, ${clockOn("jobProcedureId", "uuid")}, ${clockOn("stageKey", "text")},
        x.author_id, ${clockOn("startedAt", "timestamptz")}
      FROM y x WHERE x.kind = 'clock.on'
    )
    INSERT INTO ${into("bench_clock_ends", ["clock_id", "work_order_id", "kind", "ended_at", "recorded_by", "operation_id"])}
    SELECT ${clockOff("clockId", "uuid")}, x.work_order_id, 'clocked-off', ${clockOff("endedAt", "timestamptz")}, x.author_id, x.id
    FROM y x WHERE x.kind = 'clock.off'
  `.execute(trx);
}

/**
 * Timer stops and cancels of the batch, in one UPDATE: the earliest stop and the earliest cancel
 * are kept (with who and why), whichever batch brought them, so a cancel sent twice ends the same
 * in any order of arrival. Overrides are settled by stamp afterwards, across batches
 * (`applyFirstOverrides`).
 */
async function writeTimerEvents(trx: Tx, ops: readonly Operation[]): Promise<void> {
  const events = ops.flatMap((op, ord) => {
    const base = { ord, actor: op.authorId };
    switch (op.kind) {
      case "timer.stopped":
        return [{ ...base, timer_id: op.payload.timerId, kind: "stop", at: op.payload.stoppedAt, reason: op.payload.reason ?? null }];
      case "timer.cancelled":
        return [{ ...base, timer_id: op.payload.timerId, kind: "cancel", at: op.deviceTime, reason: op.payload.reason }];
      default:
        return [];
    }
  });
  if (!events.length) return;
  const columns = recordset<(typeof events)[number]>({
    ord: "int",
    actor: "uuid",
    timer_id: "uuid",
    kind: "text",
    at: "timestamptz",
    reason: "text",
  });
  const first = (field: string, kind: string, order: string) =>
    sql.raw(`(array_agg(e.${field} ORDER BY ${order}) FILTER (WHERE e.kind = '${kind}'))[1]`);
  await sql`
    WITH e AS (SELECT * FROM json_to_recordset(${JSON.stringify(events)}::json) AS e(${columns})),
    a AS (
      SELECT e.timer_id,
        ${first("at", "stop", "e.at, e.ord")} AS stop_at, ${first("actor", "stop", "e.at, e.ord")} AS stop_by,
        ${first("reason", "stop", "e.at, e.ord")} AS stop_reason,
        ${first("at", "cancel", "e.at, e.ord")} AS cancel_at, ${first("actor", "cancel", "e.at, e.ord")} AS cancel_by,
        ${first("reason", "cancel", "e.at, e.ord")} AS cancel_reason
      FROM e GROUP BY e.timer_id
    )
    UPDATE timers t SET
      stopped_at = CASE WHEN a.stop_at IS NOT NULL AND (t.stopped_at IS NULL OR a.stop_at < t.stopped_at) THEN a.stop_at ELSE t.stopped_at END,
      stopped_by = CASE WHEN a.stop_at IS NOT NULL AND (t.stopped_at IS NULL OR a.stop_at < t.stopped_at) THEN a.stop_by ELSE t.stopped_by END,
      stop_reason = CASE WHEN a.stop_at IS NOT NULL AND (t.stopped_at IS NULL OR a.stop_at < t.stopped_at) THEN a.stop_reason ELSE t.stop_reason END,
      cancelled_at = CASE WHEN a.cancel_at IS NOT NULL AND (t.cancelled_at IS NULL OR a.cancel_at < t.cancelled_at) THEN a.cancel_at ELSE t.cancelled_at END,
      cancelled_by = CASE WHEN a.cancel_at IS NOT NULL AND (t.cancelled_at IS NULL OR a.cancel_at < t.cancelled_at) THEN a.cancel_by ELSE t.cancelled_by END,
      cancel_reason = CASE WHEN a.cancel_at IS NOT NULL AND (t.cancelled_at IS NULL OR a.cancel_at < t.cancelled_at) THEN a.cancel_reason ELSE t.cancel_reason END
    FROM a WHERE t.id = a.timer_id
  `.execute(trx);
}

/**
 * The override of each of `timerIds` is the kept override with the earliest stamp (then id): the
 * first one made stands, whatever order the tablets' batches arrive in; later ones stay in the
 * operations and the audit log. Run after `writeKept`, so it sees the rows that statement wrote.
 */
export async function applyFirstOverrides(trx: Tx, timerIds: readonly string[]): Promise<void> {
  if (!timerIds.length) return;
  await sql`
    UPDATE timers t SET override_by = o.author_id, override_reason = o.payload->>'reason', override_at = o.device_time
    FROM (
      SELECT DISTINCT ON (payload->>'timerId') (payload->>'timerId')::uuid AS timer_id, author_id, payload, device_time
      FROM operations
      WHERE kind LIKE 'timer.%' AND kind = 'timer.overridden' AND payload->>'timerId' = ANY(${[...new Set(timerIds)]}::text[])
      ORDER BY payload->>'timerId', stamp COLLATE "C", id
    ) o
    WHERE t.id = o.timer_id
      AND (t.override_by IS DISTINCT FROM o.author_id OR t.override_reason IS DISTINCT FROM o.payload->>'reason' OR t.override_at IS DISTINCT FROM o.device_time)
  `.execute(trx);
}

/** Refusals already in the audit log with the same reason (a resent refused operation is not logged twice). */
export async function refusalsOnRecord(trx: Tx, ids: readonly string[]): Promise<Set<string>> {
  if (!ids.length) return new Set();
  const r = await sql<{ entity_id: string; reason: string }>`
    SELECT entity_id, reason FROM audit_log
    WHERE entity = 'operation' AND outcome = 'refused' AND entity_id = ANY(${[...ids]}::text[])
  `.execute(trx);
  return new Set(r.rows.map((a) => `${a.entity_id}\n${a.reason}`));
}

/** Appends many audit entries by one COPY (the same rows as db/audit/append.ts appendAudit). */
export async function appendAuditBatch(trx: Tx, entries: readonly AuditEntry[]): Promise<void> {
  await copyInto(trx, "audit_log", AUDIT_COLUMNS, entries.map(auditRow));
}
