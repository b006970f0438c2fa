import "server-only";
import { sql, type Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { mayWorkOn } from "@/lib/sync/merge-rules";
import type { BenchJobSummary, JobSnapshot, TagLookup } from "@/lib/sync/snapshot";
import { CLOSED_STATUSES, isOpenForBenchWork, OPEN_FOR_BENCH_WORK, STATUS_LABELS, type WorkOrderStatus } from "@/lib/work-orders/status";
import { clocksOfJob } from "./clocks";
import type { Database } from "../schema";
import { torqueSpecOfRow } from "../templates/documents";
import { shopCursor } from "../sync/changes";

// Read queries for the bench (the tablets' IndexedDB is filled from these). Every query is scoped
// to the signed-in user's shop.

const iso = (d: Date) => d.toISOString();
const num = (v: string | number) => Number(v);
const numOrNull = (v: string | number | null) => (v === null ? null : Number(v));

interface JobRow {
  id: string;
  shop_id: string;
  number: number;
  title: string;
  complaint: string;
  status: WorkOrderStatus;
  updated_at: Date;
  assigned_mechanic_id: string | null;
  mechanic_name: string | null;
  bike_id: string;
  make: string;
  model: string;
  year: number | null;
  tag_code: string;
  colour: string | null;
  displacement_cc: number | null;
}

const jobColumns = sql`
  w.id, w.shop_id, w.number, w.title, w.complaint, w.status, w.updated_at, w.assigned_mechanic_id, u.name AS mechanic_name,
  b.id AS bike_id, b.make, b.model, b.year, b.tag_code, b.colour, b.displacement_cc
`;
const jobFrom = sql`work_orders w JOIN bikes b ON b.id = w.bike_id LEFT JOIN users u ON u.id = w.assigned_mechanic_id`;

function bikeOf(r: JobRow) {
  return {
    id: r.bike_id,
    make: r.make,
    model: r.model,
    year: r.year,
    tagCode: r.tag_code,
    colour: r.colour,
    displacementCc: r.displacement_cc,
  };
}

/** Who is reading a job: whether they may work on it depends on it. */
type Viewer = Pick<SessionUser, "id" | "shopId" | "role">;

function assignment(user: Viewer, r: JobRow) {
  return {
    assignedMechanic: r.assigned_mechanic_id ? { id: r.assigned_mechanic_id, name: r.mechanic_name ?? "" } : null,
    assignedToMe: r.assigned_mechanic_id === user.id,
    mayWork: mayWorkOn(user, { shopId: r.shop_id, assignedMechanicId: r.assigned_mechanic_id }),
  };
}

/** Jobs in the shop open for bench work: assigned to me first, then unassigned, then the rest; by number within. */
export async function listBenchJobs(db: Kysely<Database>, user: SessionUser): Promise<BenchJobSummary[]> {
  const r = await sql<JobRow>`
    SELECT ${jobColumns} FROM ${jobFrom}
    WHERE w.shop_id = ${user.shopId}::uuid AND w.status = ANY(${[...OPEN_FOR_BENCH_WORK]}::text[])
    ORDER BY w.number
  `.execute(db);
  const rank = (j: JobRow) => (j.assigned_mechanic_id === user.id ? 0 : j.assigned_mechanic_id === null ? 1 : 2);
  return [...r.rows]
    .sort((a, b) => rank(a) - rank(b) || a.number - b.number)
    .map((j) => ({
      id: j.id,
      number: j.number,
      title: j.title,
      status: j.status,
      statusLabel: STATUS_LABELS[j.status] ?? j.status,
      ...assignment(user, j),
      bike: bikeOf(j),
      updatedAt: iso(j.updated_at),
    }));
}

export type TagResult =
  | { found: "job"; job: TagLookup }
  | { found: "bike-without-job"; tagCode: string; bikeId: string; openElsewhere: boolean }
  | { found: "nothing" };

/** The bike with this tag in the user's shop, and its job open for bench work (the newest, if several). */
export async function findJobByTag(db: Kysely<Database>, user: SessionUser, tagCode: string): Promise<TagResult> {
  const bike = await db
    .selectFrom("bikes")
    .select(["id", "tag_code", "make", "model"])
    .where("shop_id", "=", user.shopId)
    .where("tag_code", "=", tagCode)
    .executeTakeFirst();
  if (!bike) return { found: "nothing" };
  const job = await db
    .selectFrom("work_orders")
    .select(["id", "number"])
    .where("bike_id", "=", bike.id)
    .where("shop_id", "=", user.shopId)
    .where("status", "in", OPEN_FOR_BENCH_WORK)
    .orderBy("created_at", "desc")
    .orderBy("number", "desc")
    .executeTakeFirst();
  if (!job) {
    // a job open but not on the bench (booked in, quoted, ready…) is not a come-back case
    const open = await db
      .selectFrom("work_orders")
      .select("id")
      .where("bike_id", "=", bike.id)
      .where("shop_id", "=", user.shopId)
      .where("status", "not in", CLOSED_STATUSES)
      .executeTakeFirst();
    return { found: "bike-without-job", tagCode: bike.tag_code, bikeId: bike.id, openElsewhere: Boolean(open) };
  }
  return {
    found: "job",
    job: { workOrderId: job.id, number: job.number, bike: { id: bike.id, tagCode: bike.tag_code, make: bike.make, model: bike.model } },
  };
}

/**
 * Everything the bench needs for one job of the user's shop, read in one consistent snapshot; null
 * when not in the shop. Inside a caller's transaction it reads there (and sees what it wrote).
 */
export async function getJobSnapshot(db: Kysely<Database>, user: Viewer, jobId: string): Promise<JobSnapshot | null> {
  if (db.isTransaction) return readJobSnapshot(db, user, jobId);
  return db
    .transaction()
    .setIsolationLevel("repeatable read")
    .execute((trx) => readJobSnapshot(trx, user, jobId));
}

async function readJobSnapshot(trx: Kysely<Database>, user: Viewer, jobId: string): Promise<JobSnapshot | null> {
  const jobRows = await sql<JobRow>`
    SELECT ${jobColumns} FROM ${jobFrom} WHERE w.id = ${jobId}::uuid AND w.shop_id = ${user.shopId}::uuid
  `.execute(trx);
  const job = jobRows.rows[0];
  if (!job) return null;

  // the template versions pinned on the job, and everything in them
  const pinnedVersions = trx.selectFrom("job_procedures").select("template_version_id").where("work_order_id", "=", jobId);
  const pinnedSteps = trx.selectFrom("template_steps as s").where("s.template_version_id", "in", pinnedVersions);
  const [people, procedures, steps, torque, measurementSpecs, timerSpecs] = await Promise.all([
    trx
      .selectFrom("users")
      .select(["id", "name", "role"])
      .where("shop_id", "=", user.shopId)
      .where("role", "in", ["mechanic", "supervisor"] as const)
      .where("active", "=", true)
      .orderBy("name")
      .$narrowType<{ role: "mechanic" | "supervisor" }>()
      .execute(),
    trx
      .selectFrom("job_procedures as jp")
      .innerJoin("template_versions as v", "v.id", "jp.template_version_id")
      .innerJoin("procedure_templates as t", "t.id", "v.template_id")
      .select(["jp.id", "jp.position", "jp.template_version_id", "t.key", "v.name", "v.version", "v.example_only"])
      .where("jp.work_order_id", "=", jobId)
      .orderBy("jp.position")
      .execute(),
    pinnedSteps
      .select([
        "s.id",
        "s.template_version_id",
        "s.stage_key",
        "s.stage_title",
        "s.stage_position",
        "s.position",
        "s.key",
        "s.title",
        "s.instructions",
        "s.cautions",
        "s.requires_photo",
        "s.waits_for_step_key",
      ])
      .orderBy("s.stage_position")
      .orderBy("s.position")
      .execute(),
    pinnedSteps.innerJoin("torque_specs as t", "t.step_id", "s.id").selectAll("t").orderBy("t.label").orderBy("t.id").execute(),
    pinnedSteps.innerJoin("measurement_specs as m", "m.step_id", "s.id").selectAll("m").orderBy("m.key").execute(),
    pinnedSteps.innerJoin("timer_specs as t", "t.step_id", "s.id").selectAll("t").orderBy("t.label").orderBy("t.id").execute(),
  ]);
  const state = await loadJobState(trx, jobId);
  const cursor = await shopCursor(trx, user.shopId);

  const bySteps = <T extends { step_id: string }>(rows: T[]) => {
    const m = new Map<string, T[]>();
    for (const r of rows) m.set(r.step_id, [...(m.get(r.step_id) ?? []), r]);
    return m;
  };
  const torqueBy = bySteps(torque);
  const measuresBy = bySteps(measurementSpecs);
  const timersBy = bySteps(timerSpecs);

  return {
    workOrder: {
      id: job.id,
      number: job.number,
      title: job.title,
      complaint: job.complaint,
      status: job.status,
      statusLabel: STATUS_LABELS[job.status] ?? job.status,
      openForBenchWork: isOpenForBenchWork(job.status),
      ...assignment(user, job),
    },
    bike: bikeOf(job),
    people,
    procedures: procedures.map((p) => {
      const stages = new Map<string, JobSnapshot["procedures"][number]["stages"][number]>();
      for (const s of steps.filter((s) => s.template_version_id === p.template_version_id)) {
        const stage = stages.get(s.stage_key) ?? { key: s.stage_key, title: s.stage_title, position: s.stage_position, steps: [] };
        stages.set(s.stage_key, stage);
        stage.steps.push({
          id: s.id,
          key: s.key,
          title: s.title,
          position: s.position,
          instructions: s.instructions,
          cautions: s.cautions,
          requiresPhoto: s.requires_photo,
          waitsForStepKey: s.waits_for_step_key,
          torqueSpecs: (torqueBy.get(s.id) ?? []).map((t) => ({ id: t.id, ...torqueSpecOfRow(t) })),
          measurementSpecs: (measuresBy.get(s.id) ?? []).map((m) => ({
            id: m.id,
            key: m.key,
            label: m.label,
            nominal: numOrNull(m.nominal),
            min: num(m.min),
            max: num(m.max),
            unit: m.unit,
            readingLabels: m.reading_labels,
            geometry: m.geometry,
          })),
          timerSpecs: (timersBy.get(s.id) ?? []).map((t) => ({
            id: t.id,
            label: t.label,
            durationS: t.duration_s,
            blocksStepKey: t.blocks_step_key,
          })),
        });
      }
      return {
        jobProcedureId: p.id,
        position: p.position,
        templateVersionId: p.template_version_id,
        templateKey: p.key,
        name: p.name,
        version: p.version,
        exampleOnly: p.example_only,
        stages: [...stages.values()].sort((a, b) => a.position - b.position),
      };
    }),
    state,
    cursor: String(cursor),
  };
}

/** The recorded work on a job: completions, every reading (superseded too), torque, timers, sign-offs, decisions, photos, parts. */
async function loadJobState(db: Kysely<Database>, jobId: string): Promise<JobSnapshot["state"]> {
  const stampOrder = (column: string) => sql`${sql.ref(column)} COLLATE "C"`;
  const [completions, readings, torque, timers, signOffs, decisions, photos, parts, withdrawals, clocks] = await Promise.all([
    db
      .selectFrom("step_completions as c")
      .innerJoin("operations as o", "o.id", "c.id")
      .select(["c.id", "c.step_id", "c.completed_by", "c.device_time", "c.received_at", "c.flagged", "c.flag_reason", "o.seq"])
      .where("c.work_order_id", "=", jobId)
      .orderBy("o.seq")
      .execute(),
    db
      .selectFrom("measurements as m")
      .innerJoin("operations as o", "o.id", "m.id")
      .leftJoin(db.selectFrom("current_measurements").select("id").where("work_order_id", "=", jobId).as("c"), "c.id", "m.id")
      .select((eb) => [
        "m.id",
        "m.step_id",
        "m.spec_id",
        "m.reading_index",
        "m.value",
        "m.unit",
        "m.verdict",
        "m.note",
        "m.supersedes_id",
        "m.recorded_by",
        "m.device_id",
        "m.device_time",
        "m.stamp",
        "o.flagged",
        "o.flag_reason",
        eb("c.id", "is not", null).$castTo<boolean>().as("current"),
      ])
      .where("m.work_order_id", "=", jobId)
      .orderBy("m.spec_id")
      .orderBy("m.reading_index")
      .orderBy(stampOrder("m.stamp"))
      .execute(),
    db
      .selectFrom("torque_records as t")
      .innerJoin("operations as o", "o.id", "t.id")
      .select([
        "t.id",
        "t.step_id",
        "t.torque_spec_id",
        "t.pass_index",
        "t.bolt",
        "t.wrench_reading",
        "t.wrench_unit",
        "t.recorded_by",
        "t.device_time",
        "o.flagged",
        "o.flag_reason",
      ])
      .where("t.work_order_id", "=", jobId)
      .orderBy(stampOrder("o.stamp"))
      .execute(),
    db
      .selectFrom("timers")
      .select([
        "id",
        "step_id",
        "timer_spec_id",
        "label",
        "duration_s",
        "started_at",
        "started_by",
        "stopped_at",
        "override_by",
        "override_reason",
        "override_at",
        "stopped_by",
        "stop_reason",
        "cancelled_at",
        "cancelled_by",
        "cancel_reason",
      ])
      .where("work_order_id", "=", jobId)
      .orderBy("started_at")
      .execute(),
    db
      .selectFrom("sign_offs as s")
      .innerJoin("operations as o", "o.id", "s.id")
      .select(["s.id", "s.job_procedure_id", "s.stage_key", "s.signed_by", "s.device_time", "s.received_at", "o.seq"])
      .where("s.work_order_id", "=", jobId)
      .orderBy("o.seq")
      .execute(),
    db
      .selectFrom("review_decisions as d")
      .innerJoin("sign_offs as s", "s.id", "d.sign_off_id")
      .distinctOn("d.sign_off_id")
      .select([
        "d.id",
        "d.sign_off_id",
        "s.job_procedure_id",
        "s.stage_key",
        "d.decision",
        "d.reason",
        "d.reopened_step_ids",
        "d.decided_by",
        "d.decided_at",
        "d.change_seq",
      ])
      .where("s.work_order_id", "=", jobId)
      .orderBy("d.sign_off_id")
      .orderBy("d.change_seq", "desc")
      .execute(),
    db
      .selectFrom("attachments")
      .select(["id", "step_id", "content_type", "byte_size", "caption", "awaiting_upload", "created_at", "operation_id", "uploaded_by"])
      .where("work_order_id", "=", jobId)
      .where("purpose", "=", "step")
      .orderBy("created_at")
      .orderBy("id")
      .execute(),
    db
      .selectFrom("parts_fitted as p")
      .leftJoin("operations as o", "o.id", "p.operation_id")
      .select((eb) => [
        "p.id",
        "p.step_id",
        "p.part_number",
        "p.description",
        "p.supplier",
        "p.serial",
        "p.batch",
        "p.quantity",
        "p.fitted_by",
        "p.fitted_at",
        eb.fn.coalesce("o.flagged", eb.lit(false)).as("flagged"),
        "o.flag_reason",
        "p.operation_id",
      ])
      .where("p.work_order_id", "=", jobId)
      .orderBy("p.fitted_at")
      .orderBy(stampOrder("o.stamp"))
      .orderBy("p.id")
      .execute(),
    db
      .selectFrom("withdrawals")
      .select(["id", "operation_id", "target_kind", "withdrawn_by", "reason", "device_time", "received_at"])
      .where("work_order_id", "=", jobId)
      .orderBy("received_at")
      .orderBy("id")
      .execute(),
    clocksOfJob(db, jobId),
  ]);
  return {
    completions: completions.map((c) => ({
      id: c.id,
      stepId: c.step_id,
      completedBy: c.completed_by,
      deviceTime: iso(c.device_time),
      receivedAt: iso(c.received_at),
      flagged: c.flagged,
      flagReason: c.flag_reason,
      seq: String(c.seq),
    })),
    readings: readings.map((m) => ({
      id: m.id,
      stepId: m.step_id,
      specId: m.spec_id,
      readingIndex: m.reading_index,
      value: num(m.value),
      valueText: m.value,
      unit: m.unit,
      verdict: m.verdict,
      note: m.note,
      supersedesId: m.supersedes_id,
      current: m.current,
      recordedBy: m.recorded_by,
      deviceId: m.device_id,
      deviceTime: iso(m.device_time),
      stamp: m.stamp,
      flagged: m.flagged,
      flagReason: m.flag_reason,
    })),
    torqueRecords: torque.map((t) => ({
      id: t.id,
      stepId: t.step_id,
      torqueSpecId: t.torque_spec_id,
      passIndex: t.pass_index,
      bolt: t.bolt,
      wrenchReading: numOrNull(t.wrench_reading),
      wrenchReadingText: t.wrench_reading === null ? null : String(t.wrench_reading),
      wrenchUnit: t.wrench_unit,
      recordedBy: t.recorded_by,
      deviceTime: iso(t.device_time),
      flagged: t.flagged,
      flagReason: t.flag_reason,
    })),
    timers: timers.map((t) => ({
      id: t.id,
      stepId: t.step_id,
      timerSpecId: t.timer_spec_id,
      label: t.label,
      durationS: t.duration_s,
      startedAt: iso(t.started_at),
      startedBy: t.started_by,
      stoppedAt: t.stopped_at ? iso(t.stopped_at) : null,
      overrideBy: t.override_by,
      overrideReason: t.override_reason,
      overrideAt: t.override_at ? iso(t.override_at) : null,
      stoppedBy: t.stopped_by,
      stopReason: t.stop_reason,
      cancelledAt: t.cancelled_at ? iso(t.cancelled_at) : null,
      cancelledBy: t.cancelled_by,
      cancelReason: t.cancel_reason,
    })),
    signOffs: signOffs.map((s) => ({
      id: s.id,
      jobProcedureId: s.job_procedure_id,
      stageKey: s.stage_key,
      signedBy: s.signed_by,
      deviceTime: iso(s.device_time),
      receivedAt: iso(s.received_at),
      seq: String(s.seq),
    })),
    reviewDecisions: decisions.map((d) => ({
      id: d.id,
      signOffId: d.sign_off_id,
      jobProcedureId: d.job_procedure_id,
      stageKey: d.stage_key,
      decision: d.decision,
      reason: d.reason,
      reopenedStepIds: d.reopened_step_ids,
      decidedBy: d.decided_by,
      decidedAt: iso(d.decided_at),
      seq: String(d.change_seq),
    })),
    photos: photos.map((p) => ({
      id: p.id,
      stepId: p.step_id,
      contentType: p.content_type,
      byteSize: p.byte_size,
      caption: p.caption,
      awaitingUpload: p.awaiting_upload,
      createdAt: iso(p.created_at),
      operationId: p.operation_id,
      uploadedBy: p.uploaded_by,
    })),
    parts: parts.map((p) => ({
      id: p.id,
      stepId: p.step_id,
      partNumber: p.part_number,
      description: p.description,
      supplier: p.supplier,
      serial: p.serial,
      batch: p.batch,
      quantity: p.quantity,
      fittedBy: p.fitted_by,
      fittedAt: iso(p.fitted_at),
      flagged: p.flagged,
      flagReason: p.flag_reason,
      operationId: p.operation_id,
    })),
    withdrawals: withdrawals.map((w) => ({
      id: w.id,
      operationId: w.operation_id,
      kind: w.target_kind,
      withdrawnBy: w.withdrawn_by,
      reason: w.reason,
      deviceTime: iso(w.device_time),
      receivedAt: iso(w.received_at),
    })),
    clocks,
  };
}
