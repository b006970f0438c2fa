import "server-only";
import { notWithdrawn } from "../records/withdrawn";
import { sql, type Kysely, type Transaction } from "kysely";
import type {
  HoldFacts,
  WorkOrderFacts,
  MeasurementSpecFacts,
  MergeState,
  SendBackFacts,
  StepFacts,
  TimerSpecFacts,
  TorqueSpecFacts,
} from "@/lib/sync/merge-rules";
import { approvedStageKey, boltKey, emptyMergeState, HELD_WORK_KINDS } from "@/lib/sync/merge-rules";
import { partSerialOnWorkOrder } from "@/lib/sync/parts";
import type { Operation } from "@/lib/sync/operations";
import type { ReadingSpec } from "@/lib/sync/readings";
import { expectedReadings, torquePassCount } from "@/lib/procedures/spec-counts";
import type { Database } from "../schema";
import { loadClockState } from "./clocks";

// Loads what the merge rules need, in a handful of set-based queries (never one per operation).

type Db = Kysely<Database> | Transaction<Database>;

export interface LoadedWorkOrder extends WorkOrderFacts {
  bikeId: string;
  measurementSpecs: Map<string, MeasurementSpecFacts & ReadingSpec>;
}

/** `= ANY(ids)`: one array parameter for any number of ids (a 10,000-operation batch stays one parameter). */
const anyId = (ids: Iterable<string>) => sql<string>`ANY(${[...ids]}::uuid[])`;

/** The named work orders (any shop: a job of another shop comes back without its procedures, to be refused). */
export async function loadWorkOrderFacts(
  db: Db,
  shopId: string,
  jobIds: readonly string[],
  /** Also each stage's standing approval (`approvedStages`): only withdrawals and work on steps read it, so a batch with neither skips the query. */
  opts: { approvals?: boolean } = { approvals: true },
): Promise<Map<string, LoadedWorkOrder>> {
  const out = new Map<string, LoadedWorkOrder>();
  if (!jobIds.length) return out;
  const jobs = await db
    .selectFrom("work_orders as w")
    .leftJoin("users as m", "m.id", "w.assigned_mechanic_id")
    .select(["w.id", "w.shop_id", "w.bike_id", "w.number", "w.status", "w.assigned_mechanic_id", "m.name as mechanic_name"])
    .select((eb) =>
      // when the job was last (re)assigned: the office's assignment is in the audit log
      eb
        .selectFrom("audit_log as a")
        .select((a) => a.fn.max("a.at").as("at"))
        .where("a.entity", "=", "work_order")
        .where("a.action", "=", "work_order.assign")
        .whereRef("a.work_order_id", "=", "w.id")
        .as("assigned_at"),
    )
    .where("w.id", "=", anyId(jobIds))
    .execute();
  for (const j of jobs) {
    out.set(j.id, {
      id: j.id,
      shopId: j.shop_id,
      bikeId: j.bike_id,
      number: j.number,
      status: j.status,
      assignedMechanicId: j.assigned_mechanic_id,
      assignedMechanicName: j.mechanic_name,
      assignedSinceMs: j.assigned_at ? new Date(j.assigned_at).getTime() : null,
      steps: new Map(),
      measurementSpecs: new Map(),
      torqueSpecs: new Map(),
      timerSpecs: new Map(),
      sendBacks: [],
      holds: new Map(),
      approvedStages: new Set(),
    });
  }
  const own = jobs.filter((j) => j.shop_id === shopId).map((j) => j.id);
  if (!own.length) return out;

  // the steps of every procedure pinned on the jobs, and their specs
  const pinned = db
    .selectFrom("job_procedures as jp")
    .innerJoin("template_steps as s", "s.template_version_id", "jp.template_version_id")
    .where("jp.work_order_id", "=", anyId(own));
  const [steps, measurementSpecs, torqueSpecs, timerSpecs, sendBacks, holds, stageDecisions] = await Promise.all([
    pinned
      .select(["jp.work_order_id", "jp.id as job_procedure_id", "s.id", "s.key", "s.title", "s.stage_key"])
      .orderBy("jp.position")
      .orderBy("s.stage_position")
      .orderBy("s.position")
      .execute(),
    pinned
      .innerJoin("measurement_specs as m", "m.step_id", "s.id")
      .select(["jp.work_order_id", "m.id", "m.step_id", "m.label", "m.reading_labels", "m.unit", "m.min", "m.max", "m.nominal"])
      .execute(),
    pinned
      .innerJoin("torque_specs as t", "t.step_id", "s.id")
      .select([
        "jp.work_order_id",
        "t.id",
        "t.step_id",
        "t.label",
        "t.bolt_count",
        "t.final_value",
        "t.unit",
        "t.passes",
        "t.angle_passes",
        "t.torque_to_yield",
      ])
      .execute(),
    pinned.innerJoin("timer_specs as t", "t.step_id", "s.id").select(["jp.work_order_id", "t.id", "t.step_id"]).execute(),
    db
      .selectFrom("review_decisions as d")
      .innerJoin("sign_offs as so", "so.id", "d.sign_off_id")
      .select(["so.work_order_id", "d.id", "d.reopened_step_ids", "d.change_seq", "d.decided_at", "d.reason"])
      .where("d.decision", "=", "sent_back")
      .where("so.work_order_id", "=", anyId(own))
      .execute(),
    // the step each timer spec holds back: the step of the same template version with its `blocks_step_key`
    pinned
      .innerJoin("timer_specs as t", "t.step_id", "s.id")
      .innerJoin("template_steps as held", (j) =>
        j.onRef("held.template_version_id", "=", "s.template_version_id").onRef("held.key", "=", "t.blocks_step_key"),
      )
      .select(["jp.work_order_id", "t.id", "t.label", "held.id as held_step_id"])
      .execute(),
    // each stage's latest decision on a sign-off still standing (not withdrawn)
    opts.approvals === false
      ? Promise.resolve([])
      : db
          .selectFrom("review_decisions as d")
          .innerJoin("sign_offs as so", "so.id", "d.sign_off_id")
          .select(["so.work_order_id", "so.job_procedure_id", "so.stage_key", "d.decision"])
          .distinctOn(["so.job_procedure_id", "so.stage_key"])
          .where("so.work_order_id", "=", anyId(own))
          .where((eb) => eb.not(eb.exists(eb.selectFrom("withdrawals as w").select("w.id").whereRef("w.operation_id", "=", "so.id"))))
          .orderBy("so.job_procedure_id")
          .orderBy("so.stage_key")
          .orderBy("d.change_seq", "desc")
          .execute(),
  ]);
  for (const d of stageDecisions) {
    if (d.decision === "approved")
      (out.get(d.work_order_id)!.approvedStages as Set<string>).add(approvedStageKey(d.job_procedure_id, d.stage_key));
  }
  for (const s of steps) {
    const steps = out.get(s.work_order_id)!.steps as Map<string, StepFacts>;
    // A step pinned twice on one job (same version run twice) belongs to the first procedure.
    if (!steps.has(s.id)) steps.set(s.id, { key: s.key, title: s.title, jobProcedureId: s.job_procedure_id, stageKey: s.stage_key });
  }
  for (const m of measurementSpecs) {
    out.get(m.work_order_id)!.measurementSpecs.set(m.id, {
      stepId: m.step_id,
      label: m.label,
      readingCount: expectedReadings(m.reading_labels),
      unit: m.unit,
      min: Number(m.min),
      max: Number(m.max),
      nominal: m.nominal === null ? null : Number(m.nominal),
    });
  }
  for (const t of torqueSpecs) {
    (out.get(t.work_order_id)!.torqueSpecs as Map<string, TorqueSpecFacts>).set(t.id, {
      stepId: t.step_id,
      label: t.label,
      boltCount: t.bolt_count,
      passCount: torquePassCount({ finalValue: Number(t.final_value), unit: t.unit, passes: t.passes, anglePasses: t.angle_passes }),
      torqueToYield: t.torque_to_yield,
    });
  }
  for (const h of holds) {
    const map = out.get(h.work_order_id)!.holds as Map<string, HoldFacts[]>;
    map.set(h.held_step_id, [...(map.get(h.held_step_id) ?? []), { timerSpecId: h.id, label: h.label }]);
  }
  for (const t of timerSpecs) {
    (out.get(t.work_order_id)!.timerSpecs as Map<string, TimerSpecFacts>).set(t.id, { stepId: t.step_id });
  }
  for (const d of sendBacks) {
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
  const rows = await db.selectFrom("operations").select(["id", "author_id"]).where("id", "=", anyId(ids)).execute();
  return new Map(rows.map((o) => [o.id, o.author_id]));
}

/**
 * The records on file the operations name (corrections, timers, photos, part ids, entries to
 * withdraw), and, for the batch's jobs: every timer (holds), the bolts that count (two tablets on
 * one bolt) and the serial-numbered parts (a part recorded twice).
 */
export async function loadMergeState(db: Db, ops: readonly Operation[]): Promise<MergeState> {
  const state = emptyMergeState();
  const readingIds = new Set<string>();
  const timerIds = new Set<string>();
  const attachmentIds = new Set<string>();
  const partIds = new Set<string>();
  const serialJobIds = new Set<string>();
  const boltJobIds = new Set<string>();
  const entryIds = new Set<string>();
  const jobIds = new Set(ops.map((o) => o.workOrderId));
  for (const op of ops) {
    if (op.kind === "measurement.recorded" && op.payload.supersedesId) readingIds.add(op.payload.supersedesId);
    else if (op.kind === "timer.started" || op.kind === "timer.stopped" || op.kind === "timer.overridden" || op.kind === "timer.cancelled")
      timerIds.add(op.payload.timerId);
    else if (op.kind === "photo.queued") attachmentIds.add(op.payload.attachmentId);
    else if (op.kind === "torque.bolt-confirmed") boltJobIds.add(op.workOrderId);
    else if (op.kind === "entry.withdrawn") entryIds.add(op.payload.operationId);
    else if (op.kind === "part.fitted") {
      partIds.add(op.payload.partFittedId);
      if (op.payload.serial !== undefined) serialJobIds.add(op.workOrderId);
    }
  }
  const none = Promise.resolve([]);
  const stopJobIds = new Set(ops.filter((o) => o.kind === "timer.stopped" || o.kind === "timer.cancelled").map((o) => o.workOrderId));
  const [readings, timers, attachments, parts, serials, bolts, entries, clock, stepWork] = await Promise.all([
    readingIds.size
      ? db
          .selectFrom("measurements")
          .select(["id", "work_order_id", "spec_id", "reading_index"])
          .where("id", "=", anyId(readingIds))
          .execute()
      : none,
    db
      .selectFrom("timers")
      .select([
        "id",
        "work_order_id",
        "timer_spec_id",
        "started_by",
        "started_at",
        "duration_s",
        "stopped_at",
        "cancelled_at",
        "override_at",
        "override_by",
      ])
      .where((eb) => eb.or([eb("id", "=", anyId(timerIds)), eb("work_order_id", "=", anyId(jobIds))]))
      .execute(),
    attachmentIds.size ? db.selectFrom("attachments").select("id").where("id", "=", anyId(attachmentIds)).execute() : none,
    partIds.size ? db.selectFrom("parts_fitted").select("id").where("id", "=", anyId(partIds)).execute() : none,
    serialJobIds.size
      ? db
          .selectFrom("parts_fitted as p")
          .select(["p.work_order_id", "p.part_number", "p.serial", "p.step_id", "p.operation_id"])
          .where("p.work_order_id", "=", anyId(serialJobIds))
          .where("p.serial", "is not", null)
          .where((eb) =>
            eb.not(eb.exists(eb.selectFrom("withdrawals as w").select("w.id").whereRef("w.operation_id", "=", "p.operation_id"))),
          )
          .orderBy("p.fitted_at")
          .orderBy("p.id")
          .execute()
      : none,
    boltJobIds.size
      ? db
          .selectFrom("torque_records as t")
          .innerJoin("operations as o", "o.id", "t.id")
          .select(["t.id", "t.work_order_id", "t.torque_spec_id", "t.pass_index", "t.bolt", "t.device_time", "o.device_id"])
          .where("t.work_order_id", "=", anyId(boltJobIds))
          .where(notWithdrawn("t.id"))
          .orderBy("o.seq")
          .execute()
      : none,
    entryIds.size
      ? db
          .selectFrom("operations as o")
          .leftJoin("torque_records as t", "t.id", "o.id")
          .leftJoin("parts_fitted as p", "p.operation_id", "o.id")
          .select((eb) => [
            "o.id",
            "o.work_order_id",
            "o.kind",
            "o.author_id",
            "t.torque_spec_id",
            "t.pass_index",
            "t.bolt",
            "p.part_number",
            "p.serial",
            eb.not(notWithdrawn("o.id")).as("withdrawn"),
            eb.exists(eb.selectFrom("review_decisions as d").select("d.id").whereRef("d.sign_off_id", "=", "o.id")).as("decided"),
            sql<string | null>`o.payload->>'stepId'`.as("step_id"),
            eb
              .and([
                eb("o.flagged", "=", true),
                eb.not(eb.exists(eb.selectFrom("flag_acceptances as fa").select("fa.id").whereRef("fa.operation_id", "=", "o.id"))),
              ])
              .as("flagged_open"),
          ])
          .where("o.id", "=", anyId(entryIds))
          .execute()
      : none,
    loadClockState(db, ops),
    // work on the steps of jobs whose timers the batch stops or cancels (a late stop may put it inside a hold)
    stopJobIds.size
      ? db
          .selectFrom("operations as o")
          .select(["o.id", "o.work_order_id", "o.stamp", sql<string>`o.payload->>'stepId'`.as("step_id")])
          .where("o.work_order_id", "=", anyId(stopJobIds))
          .where("o.kind", "in", HELD_WORK_KINDS)
          .where(notWithdrawn("o.id"))
          .execute()
      : none,
  ]);
  if (stopJobIds.size) {
    const byJob = new Map<string, Array<{ opId: string; stepId: string; atMs: number }>>();
    for (const w of stepWork) {
      if (!w.step_id) continue;
      const ofJob = byJob.get(w.work_order_id) ?? [];
      if (!ofJob.length) byJob.set(w.work_order_id, ofJob);
      ofJob.push({ opId: w.id, stepId: w.step_id, atMs: Number(w.stamp.slice(0, 15)) });
    }
    state.stepWork = byJob;
  }
  state.clock = clock;
  for (const r of readings) state.readings.set(r.id, { workOrderId: r.work_order_id, specId: r.spec_id, readingIndex: r.reading_index });
  for (const t of timers) {
    state.timers.set(t.id, {
      id: t.id,
      workOrderId: t.work_order_id,
      timerSpecId: t.timer_spec_id,
      startedBy: t.started_by,
      startedAtMs: t.started_at.getTime(),
      durationS: t.duration_s,
      stoppedAtMs: t.stopped_at?.getTime() ?? null,
      cancelled: t.cancelled_at !== null,
      // an override from before override times were kept counts from the start
      overrideAtMs: t.override_at?.getTime() ?? (t.override_by !== null ? t.started_at.getTime() : null),
    });
  }
  for (const a of attachments) state.attachmentIds.add(a.id);
  for (const p of parts) state.partIds.add(p.id);
  for (const p of serials) {
    const key = partSerialOnWorkOrder(p.work_order_id, p.part_number, p.serial!);
    if (!state.partSerials.has(key)) state.partSerials.set(key, { stepId: p.step_id, operationId: p.operation_id });
  }
  for (const b of bolts) {
    const key = boltKey(b.work_order_id, b.torque_spec_id, b.pass_index, b.bolt);
    state.bolts.set(key, [...(state.bolts.get(key) ?? []), { id: b.id, deviceId: b.device_id, deviceTime: b.device_time.toISOString() }]);
  }
  for (const e of entries) {
    state.entries.set(e.id, {
      workOrderId: e.work_order_id,
      kind: e.kind,
      authorId: e.author_id,
      withdrawn: Boolean(e.withdrawn),
      ...(e.torque_spec_id !== null ? { boltKey: boltKey(e.work_order_id, e.torque_spec_id, e.pass_index!, e.bolt!) } : {}),
      ...(e.serial !== null && e.part_number !== null
        ? { serialKey: partSerialOnWorkOrder(e.work_order_id, e.part_number, e.serial) }
        : {}),
      ...(e.kind === "stage.signed-off" ? { decided: Boolean(e.decided) } : {}),
      ...(e.step_id !== null ? { stepId: e.step_id } : {}),
      ...(e.flagged_open ? { flaggedOpen: true } : {}),
    });
  }
  return state;
}
