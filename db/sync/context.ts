import { sql, type Kysely, type Transaction } from "kysely";
import type { LengthUnit } from "@/lib/calc/units";
import type {
  JobFacts,
  MeasurementSpecFacts,
  MergeState,
  SendBackFacts,
  StepFacts,
  TimerSpecFacts,
  TorqueSpecFacts,
} from "@/lib/sync/merge-rules";
import { emptyMergeState } from "@/lib/sync/merge-rules";
import { partSerialOnJob } from "@/lib/sync/parts";
import type { Operation } from "@/lib/sync/operations";
import type { ReadingSpec } from "@/lib/sync/readings";
import type { WorkOrderStatus } from "@/lib/work-orders/status";
import type { Database } from "../schema";

// Loads what the merge rules need, in a handful of set-based queries (never one per operation).

type Db = Kysely<Database> | Transaction<Database>;

export interface LoadedJob extends JobFacts {
  bikeId: string;
  measurementSpecs: Map<string, MeasurementSpecFacts & ReadingSpec>;
}

/** The named work orders (any shop: a job of another shop comes back without its procedures, to be refused). */
export async function loadJobFacts(db: Db, shopId: string, jobIds: readonly string[]): Promise<Map<string, LoadedJob>> {
  const out = new Map<string, LoadedJob>();
  if (!jobIds.length) return out;
  const jobs = await sql<{ id: string; shop_id: string; bike_id: string; number: number; status: string; assigned_mechanic_id: string | null }>`
    SELECT id, shop_id, bike_id, number, status, assigned_mechanic_id FROM work_orders WHERE id = ANY(${[...jobIds]}::uuid[])
  `.execute(db);
  for (const j of jobs.rows) {
    out.set(j.id, {
      id: j.id,
      shopId: j.shop_id,
      bikeId: j.bike_id,
      number: j.number,
      status: j.status as WorkOrderStatus,
      assignedMechanicId: j.assigned_mechanic_id,
      steps: new Map(),
      measurementSpecs: new Map(),
      torqueSpecs: new Map(),
      timerSpecs: new Map(),
      sendBacks: [],
    });
  }
  const own = jobs.rows.filter((j) => j.shop_id === shopId).map((j) => j.id);
  if (!own.length) return out;

  const [steps, measurementSpecs, torqueSpecs, timerSpecs, sendBacks] = await Promise.all([
    sql<{ work_order_id: string; job_procedure_id: string; id: string; key: string; title: string; stage_key: string }>`
      SELECT jp.work_order_id, jp.id AS job_procedure_id, s.id, s.key, s.title, s.stage_key
      FROM job_procedures jp JOIN template_steps s ON s.template_version_id = jp.template_version_id
      WHERE jp.work_order_id = ANY(${own}::uuid[])
      ORDER BY jp.position, s.stage_position, s.position
    `.execute(db),
    sql<{ work_order_id: string; id: string; step_id: string; label: string; readings: number; unit: LengthUnit; min: string; max: string; nominal: string | null }>`
      SELECT jp.work_order_id, m.id, m.step_id, m.label, cardinality(m.reading_labels) AS readings, m.unit, m.min, m.max, m.nominal
      FROM job_procedures jp
      JOIN template_steps s ON s.template_version_id = jp.template_version_id
      JOIN measurement_specs m ON m.step_id = s.id
      WHERE jp.work_order_id = ANY(${own}::uuid[])
    `.execute(db),
    sql<{ work_order_id: string; id: string; step_id: string; label: string; bolt_count: number; passes: number; angles: number }>`
      SELECT jp.work_order_id, t.id, t.step_id, t.label, t.bolt_count,
        jsonb_array_length(t.passes) AS passes, jsonb_array_length(t.angle_passes) AS angles
      FROM job_procedures jp
      JOIN template_steps s ON s.template_version_id = jp.template_version_id
      JOIN torque_specs t ON t.step_id = s.id
      WHERE jp.work_order_id = ANY(${own}::uuid[])
    `.execute(db),
    sql<{ work_order_id: string; id: string; step_id: string }>`
      SELECT jp.work_order_id, t.id, t.step_id
      FROM job_procedures jp
      JOIN template_steps s ON s.template_version_id = jp.template_version_id
      JOIN timer_specs t ON t.step_id = s.id
      WHERE jp.work_order_id = ANY(${own}::uuid[])
    `.execute(db),
    sql<{ work_order_id: string; id: string; reopened_step_ids: string[]; change_seq: string | number; decided_at: Date; reason: string }>`
      SELECT so.work_order_id, d.id, d.reopened_step_ids, d.change_seq, d.decided_at, d.reason
      FROM review_decisions d JOIN sign_offs so ON so.id = d.sign_off_id
      WHERE d.decision = 'sent_back' AND so.work_order_id = ANY(${own}::uuid[])
    `.execute(db),
  ]);
  for (const s of steps.rows) {
    const steps = out.get(s.work_order_id)!.steps as Map<string, StepFacts>;
    // A step pinned twice on one job (same version run twice) belongs to the first procedure.
    if (!steps.has(s.id)) steps.set(s.id, { key: s.key, title: s.title, jobProcedureId: s.job_procedure_id, stageKey: s.stage_key });
  }
  for (const m of measurementSpecs.rows) {
    out.get(m.work_order_id)!.measurementSpecs.set(m.id, {
      stepId: m.step_id,
      label: m.label,
      readingCount: Math.max(1, Number(m.readings)),
      unit: m.unit,
      min: Number(m.min),
      max: Number(m.max),
      nominal: m.nominal === null ? null : Number(m.nominal),
    });
  }
  for (const t of torqueSpecs.rows) {
    (out.get(t.work_order_id)!.torqueSpecs as Map<string, TorqueSpecFacts>).set(t.id, {
      stepId: t.step_id,
      label: t.label,
      boltCount: t.bolt_count,
      passCount: Math.max(1, Number(t.passes)) + Number(t.angles),
    });
  }
  for (const t of timerSpecs.rows) {
    (out.get(t.work_order_id)!.timerSpecs as Map<string, TimerSpecFacts>).set(t.id, { stepId: t.step_id });
  }
  for (const d of sendBacks.rows) {
    (out.get(d.work_order_id)!.sendBacks as SendBackFacts[]).push({
      decisionId: d.id,
      stepIds: d.reopened_step_ids,
      seq: Number(d.change_seq),
      decidedAtMs: d.decided_at.getTime(),
      reason: d.reason,
    });
  }
  return out;
}

/** Operations already on file among `ids`, with their author. */
export async function existingOperations(db: Db, ids: readonly string[]): Promise<Map<string, string>> {
  if (!ids.length) return new Map();
  const r = await sql<{ id: string; author_id: string }>`
    SELECT id, author_id FROM operations WHERE id = ANY(${[...ids]}::uuid[])
  `.execute(db);
  return new Map(r.rows.map((o) => [o.id, o.author_id]));
}

/**
 * The readings, timers, photos and part records on file that the operations name (corrections,
 * timer stops, photo and part ids), and the serial-numbered parts already on the jobs that get one.
 */
export async function loadMergeState(db: Db, ops: readonly Operation[]): Promise<MergeState> {
  const state = emptyMergeState();
  const readingIds = new Set<string>();
  const timerIds = new Set<string>();
  const attachmentIds = new Set<string>();
  const partIds = new Set<string>();
  const serialJobIds = new Set<string>();
  for (const op of ops) {
    if (op.kind === "measurement.recorded" && op.payload.supersedesId) readingIds.add(op.payload.supersedesId);
    else if (op.kind === "timer.started" || op.kind === "timer.stopped" || op.kind === "timer.overridden") timerIds.add(op.payload.timerId);
    else if (op.kind === "photo.queued") attachmentIds.add(op.payload.attachmentId);
    else if (op.kind === "part.fitted") {
      partIds.add(op.payload.partFittedId);
      if (op.payload.serial !== undefined) serialJobIds.add(op.workOrderId);
    }
  }
  const [readings, timers, attachments, parts, serials] = await Promise.all([
    readingIds.size
      ? sql<{ id: string; work_order_id: string; spec_id: string; reading_index: number }>`
          SELECT id, work_order_id, spec_id, reading_index FROM measurements WHERE id = ANY(${[...readingIds]}::uuid[])
        `.execute(db)
      : { rows: [] },
    timerIds.size
      ? sql<{ id: string; work_order_id: string; started_at: Date; stopped_at: Date | null }>`
          SELECT id, work_order_id, started_at, stopped_at FROM timers WHERE id = ANY(${[...timerIds]}::uuid[])
        `.execute(db)
      : { rows: [] },
    attachmentIds.size
      ? sql<{ id: string }>`SELECT id FROM attachments WHERE id = ANY(${[...attachmentIds]}::uuid[])`.execute(db)
      : { rows: [] },
    partIds.size
      ? sql<{ id: string }>`SELECT id FROM parts_fitted WHERE id = ANY(${[...partIds]}::uuid[])`.execute(db)
      : { rows: [] },
    serialJobIds.size
      ? sql<{ work_order_id: string; part_number: string; serial: string; step_id: string | null }>`
          SELECT work_order_id, part_number, serial, step_id FROM parts_fitted
          WHERE work_order_id = ANY(${[...serialJobIds]}::uuid[]) AND serial IS NOT NULL
          ORDER BY fitted_at, id
        `.execute(db)
      : { rows: [] },
  ]);
  for (const r of readings.rows) state.readings.set(r.id, { workOrderId: r.work_order_id, specId: r.spec_id, readingIndex: r.reading_index });
  for (const t of timers.rows) {
    state.timers.set(t.id, { workOrderId: t.work_order_id, startedAtMs: t.started_at.getTime(), stoppedAtMs: t.stopped_at?.getTime() ?? null });
  }
  for (const a of attachments.rows) state.attachmentIds.add(a.id);
  for (const p of parts.rows) state.partIds.add(p.id);
  for (const p of serials.rows) {
    const key = partSerialOnJob(p.work_order_id, p.part_number, p.serial);
    if (!state.partSerials.has(key)) state.partSerials.set(key, { stepId: p.step_id });
  }
  return state;
}
