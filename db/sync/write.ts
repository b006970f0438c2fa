import "server-only";
import { sql, type Transaction } from "kysely";
import type { Decision, MergeState } from "@/lib/sync/merge-rules";
import type { Operation, OperationKind } from "@/lib/sync/operations";
import { readingVerdict } from "@/lib/sync/readings";
import { auditRow, type AuditEntry } from "../audit/append";
import type { LoadedWorkOrder } from "./context";
import type { Database } from "../schema";

// Set-based writes for the merge: every statement takes all its rows as one JSON array
// (INSERT … SELECT FROM json_to_recordset), so a batch costs a fixed number of round trips
// whatever its size, and no statement runs into the 65,535-parameter limit. No row-at-a-time loop.

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
 * Also gives the merge enough sort memory to keep a 10,000-operation batch off the disk.
 */
export async function lockShopForSync(trx: Tx, shopId: string): Promise<void> {
  await sql`SELECT benchtag_lock_shop_sync(${shopId}::uuid), set_config('work_mem', '64MB', true)`.execute(trx);
}

/**
 * Writes the kept operations: ONE statement for the operations, the read tables and the audit log,
 * then (only when the batch holds any) one statement for timer stops and cancels.
 * In the first, the JSON array is parsed once (json_to_recordset), then data-modifying CTEs insert
 * into `operations` (in stamp order, ON CONFLICT (id) DO NOTHING) and, for the rows actually
 * inserted, into the read tables and the audit log. Foreign keys are checked at the end of the
 * statement, so a read-table row may name an operation inserted beside it. The timer statement
 * runs second because CTEs of one statement cannot see each other's rows (a timer started and
 * stopped in the same batch). Returns the ids inserted (fewer than kept only if another
 * transaction stored an id meanwhile). Overrides are settled after, by stamp (`applyFirstOverrides`).
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
): Promise<Set<string>> {
  if (!kept.length) return new Set();
  const rows = kept.map((k, ord) => {
    const { op } = k;
    let verdict: string | null = null;
    let bikeId: string | null = null;
    let targetKind: string | null = null;
    if (op.kind === "measurement.recorded") {
      verdict = readingVerdict(op.payload.value, op.payload.unit, jobs.get(op.workOrderId)!.measurementSpecs.get(op.payload.specId)!);
    } else if (op.kind === "photo.queued") {
      bikeId = jobs.get(op.workOrderId)!.bikeId;
    } else if (op.kind === "entry.withdrawn") {
      targetKind = state.entries.get(op.payload.operationId)?.kind ?? null;
    }
    return {
      ord,
      id: op.id,
      work_order_id: op.workOrderId,
      kind: op.kind,
      author_id: op.authorId,
      device_id: op.deviceId,
      device_time: op.deviceTime,
      stamp: op.stamp,
      payload: op.payload,
      flagged: k.decision.outcome === "flag",
      flag_reason: flagReason(k),
      verdict,
      bike_id: bikeId,
      target_kind: targetKind,
    };
  });
  const columns = recordset<(typeof rows)[number]>({
    ord: "int",
    id: "uuid",
    work_order_id: "uuid",
    kind: "text",
    author_id: "uuid",
    device_id: "text",
    device_time: "timestamptz",
    stamp: "text",
    payload: "jsonb",
    flagged: "boolean",
    flag_reason: "text",
    verdict: "text",
    bike_id: "uuid",
    target_kind: "text",
  });
  const step = payloadOf("step.completed");
  const reading = payloadOf("measurement.recorded");
  const torque = payloadOf("torque.bolt-confirmed");
  const timer = payloadOf("timer.started");
  const photo = payloadOf("photo.queued");
  const signOff = payloadOf("stage.signed-off");
  const part = payloadOf("part.fitted");
  const withdrawal = payloadOf("entry.withdrawn");
  const clockOn = payloadOf("clock.on");
  const clockOff = payloadOf("clock.off");
  const r = await sql<{ id: string }>`
    WITH x AS MATERIALIZED (
      SELECT * FROM json_to_recordset(${JSON.stringify(rows)}::json) AS x(${columns})
    ),
    ops AS (
      INSERT INTO ${into("operations", ["id", "shop_id", "work_order_id", "kind", "author_id", "device_id", "device_time", "stamp", "payload", "flagged", "flag_reason"])}
      SELECT x.id, ${shopId}::uuid, x.work_order_id, x.kind, x.author_id, x.device_id, x.device_time, x.stamp, x.payload, x.flagged, x.flag_reason
      FROM x ORDER BY x.ord
      ON CONFLICT (id) DO NOTHING
      RETURNING id
    ),
    y AS MATERIALIZED (SELECT x.* FROM x JOIN ops ON ops.id = x.id),
    completions AS (
      INSERT INTO ${into("step_completions", ["id", "work_order_id", "step_id", "completed_by", "device_time", "flagged", "flag_reason"])}
      SELECT x.id, x.work_order_id, ${step("stepId", "uuid")}, x.author_id, x.device_time, x.flagged, x.flag_reason
      FROM y x WHERE x.kind = 'step.completed'
    ),
    readings AS (
      -- the value goes in as the decimal text typed: numeric keeps its scale ("0.030" stays "0.030")
      INSERT INTO ${into("measurements", ["id", "work_order_id", "step_id", "spec_id", "reading_index", "value", "unit", "verdict", "note", "supersedes_id", "recorded_by", "device_id", "device_time", "stamp"])}
      SELECT x.id, x.work_order_id, ${reading("stepId", "uuid")}, ${reading("specId", "uuid")}, ${reading("readingIndex", "int")},
        ${reading("value", "numeric")}, ${reading("unit", "text")}, x.verdict, COALESCE(${reading("note", "text")}, ''), ${reading("supersedesId", "uuid")},
        x.author_id, x.device_id, x.device_time, x.stamp
      FROM y x WHERE x.kind = 'measurement.recorded'
    ),
    torque AS (
      INSERT INTO ${into("torque_records", ["id", "work_order_id", "step_id", "torque_spec_id", "pass_index", "bolt", "wrench_reading", "wrench_unit", "recorded_by", "device_time"])}
      SELECT x.id, x.work_order_id, ${torque("stepId", "uuid")}, ${torque("torqueSpecId", "uuid")}, ${torque("passIndex", "int")}, ${torque("bolt", "int")},
        ${torque("wrenchReading", "numeric")}, ${torque("wrenchUnit", "text")}, x.author_id, x.device_time
      FROM y x WHERE x.kind = 'torque.bolt-confirmed'
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
    ),
    clocks_off AS (
      INSERT INTO ${into("bench_clock_ends", ["clock_id", "work_order_id", "kind", "ended_at", "recorded_by", "operation_id"])}
      SELECT ${clockOff("clockId", "uuid")}, x.work_order_id, 'clocked-off', ${clockOff("endedAt", "timestamptz")}, x.author_id, x.id
      FROM y x WHERE x.kind = 'clock.off'
    ),
    audit AS (
      INSERT INTO ${into("audit_log", ["shop_id", "actor_id", "device_id", "action", "entity", "entity_id", "work_order_id", "outcome", "reason", "detail"])}
      SELECT ${shopId}::uuid, x.author_id, x.device_id, 'sync.' || x.kind, 'operation', x.id::text, x.work_order_id,
        'accepted', x.flag_reason, jsonb_build_object('stamp', x.stamp, 'flagged', x.flagged)
      FROM y x ORDER BY x.ord
    )
    SELECT id FROM ops
  `.execute(trx);
  const inserted = new Set(r.rows.map((o) => o.id));
  await writeTimerEvents(
    trx,
    kept.map((k) => k.op).filter((op) => inserted.has(op.id)),
  );
  return inserted;
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

/** Appends many audit entries in one statement (the same rows as db/audit/append.ts appendAudit, without its per-value parameters). */
export async function appendAuditBatch(trx: Tx, entries: readonly AuditEntry[]): Promise<void> {
  if (!entries.length) return;
  const rows = entries.map(auditRow);
  const columns = recordset<(typeof rows)[number]>({
    shop_id: "uuid",
    actor_id: "uuid",
    device_id: "text",
    action: "text",
    entity: "text",
    entity_id: "text",
    work_order_id: "uuid",
    outcome: "text",
    reason: "text",
    detail: "jsonb",
  });
  await sql`
    INSERT INTO ${into("audit_log", ["shop_id", "actor_id", "device_id", "action", "entity", "entity_id", "work_order_id", "outcome", "reason", "detail"])}
    SELECT x.shop_id, x.actor_id, x.device_id, x.action, x.entity, x.entity_id, x.work_order_id, x.outcome, x.reason, x.detail
    FROM json_to_recordset(${JSON.stringify(rows)}::json) AS x(${columns})
  `.execute(trx);
}
