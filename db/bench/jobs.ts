import { sql, type Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { mayWorkJob } from "@/lib/sync/merge-rules";
import type { BenchJobSummary, JobSnapshot, TagLookup } from "@/lib/sync/snapshot";
import { isOpenForBenchWork, STATUS_LABELS, WORK_ORDER_STATUSES, type WorkOrderStatus } from "@/lib/work-orders/status";
import type { Database } from "../schema";
import { shopCursor } from "../sync/changes";

// Read queries for the bench (the tablets' IndexedDB is filled from these). Every query is scoped
// to the signed-in user's shop.

const OPEN_FOR_BENCH = WORK_ORDER_STATUSES.filter(isOpenForBenchWork);
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
  return { id: r.bike_id, make: r.make, model: r.model, year: r.year, tagCode: r.tag_code, colour: r.colour, displacementCc: r.displacement_cc };
}

function assignment(user: SessionUser, r: JobRow) {
  return {
    assignedMechanic: r.assigned_mechanic_id ? { id: r.assigned_mechanic_id, name: r.mechanic_name ?? "" } : null,
    assignedToMe: r.assigned_mechanic_id === user.id,
    mayWork: mayWorkJob(user, { shopId: r.shop_id, assignedMechanicId: r.assigned_mechanic_id }),
  };
}

/** Jobs in the shop open for bench work: assigned to me first, then unassigned, then the rest; by number within. */
export async function listBenchJobs(db: Kysely<Database>, user: SessionUser): Promise<BenchJobSummary[]> {
  const r = await sql<JobRow>`
    SELECT ${jobColumns} FROM ${jobFrom}
    WHERE w.shop_id = ${user.shopId}::uuid AND w.status = ANY(${OPEN_FOR_BENCH}::text[])
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
  | { found: "bike-without-job"; tagCode: string }
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
    .where("status", "in", OPEN_FOR_BENCH)
    .orderBy("created_at", "desc")
    .orderBy("number", "desc")
    .executeTakeFirst();
  if (!job) return { found: "bike-without-job", tagCode: bike.tag_code };
  return {
    found: "job",
    job: { workOrderId: job.id, number: job.number, bike: { id: bike.id, tagCode: bike.tag_code, make: bike.make, model: bike.model } },
  };
}

/** Everything the bench needs for one job of the user's shop, read in one consistent snapshot; null when not in the shop. */
export async function getJobSnapshot(db: Kysely<Database>, user: SessionUser, jobId: string): Promise<JobSnapshot | null> {
  return db
    .transaction()
    .setIsolationLevel("repeatable read")
    .execute(async (trx) => {
      const jobRows = await sql<JobRow>`
        SELECT ${jobColumns} FROM ${jobFrom} WHERE w.id = ${jobId}::uuid AND w.shop_id = ${user.shopId}::uuid
      `.execute(trx);
      const job = jobRows.rows[0];
      if (!job) return null;

      const [people, procedures, steps, torque, measurementSpecs, timerSpecs] = await Promise.all([
        sql<{ id: string; name: string; role: "mechanic" | "supervisor" }>`
          SELECT id, name, role FROM users
          WHERE shop_id = ${user.shopId}::uuid AND role IN ('mechanic', 'supervisor') AND active ORDER BY name
        `.execute(trx),
        sql<{ id: string; position: number; template_version_id: string; key: string; name: string; version: number; example_only: boolean }>`
          SELECT jp.id, jp.position, jp.template_version_id, t.key, v.name, v.version, v.example_only
          FROM job_procedures jp
          JOIN template_versions v ON v.id = jp.template_version_id
          JOIN procedure_templates t ON t.id = v.template_id
          WHERE jp.work_order_id = ${jobId}::uuid ORDER BY jp.position
        `.execute(trx),
        sql<{
          id: string; template_version_id: string; stage_key: string; stage_title: string; stage_position: number; position: number;
          key: string; title: string; instructions: string; cautions: { kind: string; text: string }[]; requires_photo: boolean;
          waits_for_step_key: string | null;
        }>`
          SELECT s.id, s.template_version_id, s.stage_key, s.stage_title, s.stage_position, s.position, s.key, s.title,
            s.instructions, s.cautions, s.requires_photo, s.waits_for_step_key
          FROM template_steps s
          WHERE s.template_version_id IN (SELECT template_version_id FROM job_procedures WHERE work_order_id = ${jobId}::uuid)
          ORDER BY s.stage_position, s.position
        `.execute(trx),
        sql<{
          id: string; step_id: string; label: string; final_value: string; unit: "N·m" | "lbf·ft" | "lbf·in" | "kgf·m";
          passes: ({ percent: number } | { value: number })[]; angle_passes: number[]; pattern: "cross" | "spiral-out" | "linear";
          bolt_count: number; lubricant: string; torque_to_yield: boolean;
        }>`
          SELECT t.* FROM torque_specs t JOIN template_steps s ON s.id = t.step_id
          WHERE s.template_version_id IN (SELECT template_version_id FROM job_procedures WHERE work_order_id = ${jobId}::uuid)
          ORDER BY t.label, t.id
        `.execute(trx),
        sql<{
          id: string; step_id: string; key: string; label: string; nominal: string | null; min: string; max: string;
          unit: "mm" | "in" | "µm"; reading_labels: string[]; geometry: "bore" | "oil-clearance" | null;
        }>`
          SELECT m.* FROM measurement_specs m JOIN template_steps s ON s.id = m.step_id
          WHERE s.template_version_id IN (SELECT template_version_id FROM job_procedures WHERE work_order_id = ${jobId}::uuid)
          ORDER BY m.key
        `.execute(trx),
        sql<{ id: string; step_id: string; label: string; duration_s: number; blocks_step_key: string | null }>`
          SELECT t.* FROM timer_specs t JOIN template_steps s ON s.id = t.step_id
          WHERE s.template_version_id IN (SELECT template_version_id FROM job_procedures WHERE work_order_id = ${jobId}::uuid)
          ORDER BY t.label, t.id
        `.execute(trx),
      ]);
      const state = await loadJobState(trx, jobId);
      const cursor = await shopCursor(trx, user.shopId);

      const bySteps = <T extends { step_id: string }>(rows: T[]) => {
        const m = new Map<string, T[]>();
        for (const r of rows) m.set(r.step_id, [...(m.get(r.step_id) ?? []), r]);
        return m;
      };
      const torqueBy = bySteps(torque.rows);
      const measuresBy = bySteps(measurementSpecs.rows);
      const timersBy = bySteps(timerSpecs.rows);

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
        people: people.rows,
        procedures: procedures.rows.map((p) => {
          const stages = new Map<string, JobSnapshot["procedures"][number]["stages"][number]>();
          for (const s of steps.rows.filter((s) => s.template_version_id === p.template_version_id)) {
            const stage = stages.get(s.stage_key) ?? { key: s.stage_key, title: s.stage_title, position: s.stage_position, steps: [] };
            stages.set(s.stage_key, stage);
            stage.steps.push({
              id: s.id,
              key: s.key,
              title: s.title,
              position: s.position,
              instructions: s.instructions,
              cautions: s.cautions as JobSnapshot["procedures"][number]["stages"][number]["steps"][number]["cautions"],
              requiresPhoto: s.requires_photo,
              waitsForStepKey: s.waits_for_step_key,
              torqueSpecs: (torqueBy.get(s.id) ?? []).map((t) => ({
                id: t.id,
                label: t.label,
                finalValue: num(t.final_value),
                unit: t.unit,
                passes: t.passes,
                anglePasses: t.angle_passes,
                pattern: t.pattern,
                boltCount: t.bolt_count,
                lubricant: t.lubricant,
                torqueToYield: t.torque_to_yield,
              })),
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
    });
}

/** The recorded work on a job: completions, every reading (superseded too), torque, timers, sign-offs, decisions, photos, parts. */
async function loadJobState(db: Kysely<Database>, jobId: string): Promise<JobSnapshot["state"]> {
  const [completions, readings, torque, timers, signOffs, decisions, photos, parts] = await Promise.all([
    sql<{ id: string; step_id: string; completed_by: string; device_time: Date; received_at: Date; flagged: boolean; flag_reason: string | null; seq: string | number }>`
      SELECT c.id, c.step_id, c.completed_by, c.device_time, c.received_at, c.flagged, c.flag_reason, o.seq
      FROM step_completions c JOIN operations o ON o.id = c.id
      WHERE c.work_order_id = ${jobId}::uuid ORDER BY o.seq
    `.execute(db),
    sql<{
      id: string; step_id: string; spec_id: string; reading_index: number; value: string; unit: "mm" | "in" | "µm";
      verdict: "in" | "low" | "high"; note: string; supersedes_id: string | null; recorded_by: string; device_id: string;
      device_time: Date; stamp: string; flagged: boolean; flag_reason: string | null; current: boolean;
    }>`
      SELECT m.id, m.step_id, m.spec_id, m.reading_index, m.value, m.unit, m.verdict, m.note, m.supersedes_id, m.recorded_by,
        m.device_id, m.device_time, m.stamp, o.flagged, o.flag_reason, (c.id IS NOT NULL) AS current
      FROM measurements m
      JOIN operations o ON o.id = m.id
      LEFT JOIN (SELECT id FROM current_measurements WHERE work_order_id = ${jobId}::uuid) c ON c.id = m.id
      WHERE m.work_order_id = ${jobId}::uuid
      ORDER BY m.spec_id, m.reading_index, m.stamp COLLATE "C"
    `.execute(db),
    sql<{
      id: string; step_id: string; torque_spec_id: string; pass_index: number; bolt: number; wrench_reading: string | null;
      wrench_unit: string | null; recorded_by: string; device_time: Date;
    }>`
      SELECT t.id, t.step_id, t.torque_spec_id, t.pass_index, t.bolt, t.wrench_reading, t.wrench_unit, t.recorded_by, t.device_time
      FROM torque_records t JOIN operations o ON o.id = t.id
      WHERE t.work_order_id = ${jobId}::uuid ORDER BY o.stamp COLLATE "C"
    `.execute(db),
    sql<{
      id: string; step_id: string; timer_spec_id: string | null; label: string; duration_s: number; started_at: Date;
      started_by: string; stopped_at: Date | null; override_by: string | null; override_reason: string | null;
    }>`
      SELECT id, step_id, timer_spec_id, label, duration_s, started_at, started_by, stopped_at, override_by, override_reason
      FROM timers WHERE work_order_id = ${jobId}::uuid ORDER BY started_at
    `.execute(db),
    sql<{ id: string; job_procedure_id: string; stage_key: string; signed_by: string; device_time: Date; received_at: Date; seq: string | number }>`
      SELECT s.id, s.job_procedure_id, s.stage_key, s.signed_by, s.device_time, s.received_at, o.seq
      FROM sign_offs s JOIN operations o ON o.id = s.id
      WHERE s.work_order_id = ${jobId}::uuid ORDER BY o.seq
    `.execute(db),
    sql<{
      id: string; sign_off_id: string; job_procedure_id: string; stage_key: string; decision: "approved" | "sent_back"; reason: string;
      reopened_step_ids: string[]; decided_by: string; decided_at: Date; change_seq: string | number;
    }>`
      SELECT DISTINCT ON (d.sign_off_id) d.id, d.sign_off_id, s.job_procedure_id, s.stage_key, d.decision, d.reason,
        d.reopened_step_ids, d.decided_by, d.decided_at, d.change_seq
      FROM review_decisions d JOIN sign_offs s ON s.id = d.sign_off_id
      WHERE s.work_order_id = ${jobId}::uuid
      ORDER BY d.sign_off_id, d.change_seq DESC
    `.execute(db),
    sql<{ id: string; step_id: string | null; content_type: string; byte_size: number; caption: string; awaiting_upload: boolean; created_at: Date }>`
      SELECT id, step_id, content_type, byte_size, caption, awaiting_upload, created_at
      FROM attachments WHERE work_order_id = ${jobId}::uuid AND purpose = 'step' ORDER BY created_at, id
    `.execute(db),
    sql<{
      id: string; step_id: string | null; part_number: string; description: string; supplier: string; serial: string | null;
      batch: string | null; quantity: number; fitted_by: string | null; fitted_at: Date; flagged: boolean; flag_reason: string | null;
    }>`
      SELECT p.id, p.step_id, p.part_number, p.description, p.supplier, p.serial, p.batch, p.quantity, p.fitted_by, p.fitted_at,
        COALESCE(o.flagged, false) AS flagged, o.flag_reason
      FROM parts_fitted p LEFT JOIN operations o ON o.id = p.operation_id
      WHERE p.work_order_id = ${jobId}::uuid ORDER BY p.fitted_at, o.stamp COLLATE "C", p.id
    `.execute(db),
  ]);
  return {
    completions: completions.rows.map((c) => ({
      id: c.id,
      stepId: c.step_id,
      completedBy: c.completed_by,
      deviceTime: iso(c.device_time),
      receivedAt: iso(c.received_at),
      flagged: c.flagged,
      flagReason: c.flag_reason,
      seq: String(c.seq),
    })),
    readings: readings.rows.map((m) => ({
      id: m.id,
      stepId: m.step_id,
      specId: m.spec_id,
      readingIndex: m.reading_index,
      value: num(m.value),
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
    torqueRecords: torque.rows.map((t) => ({
      id: t.id,
      stepId: t.step_id,
      torqueSpecId: t.torque_spec_id,
      passIndex: t.pass_index,
      bolt: t.bolt,
      wrenchReading: numOrNull(t.wrench_reading),
      wrenchUnit: t.wrench_unit,
      recordedBy: t.recorded_by,
      deviceTime: iso(t.device_time),
    })),
    timers: timers.rows.map((t) => ({
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
    })),
    signOffs: signOffs.rows.map((s) => ({
      id: s.id,
      jobProcedureId: s.job_procedure_id,
      stageKey: s.stage_key,
      signedBy: s.signed_by,
      deviceTime: iso(s.device_time),
      receivedAt: iso(s.received_at),
      seq: String(s.seq),
    })),
    reviewDecisions: decisions.rows.map((d) => ({
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
    photos: photos.rows.map((p) => ({
      id: p.id,
      stepId: p.step_id,
      contentType: p.content_type,
      byteSize: p.byte_size,
      caption: p.caption,
      awaitingUpload: p.awaiting_upload,
      createdAt: iso(p.created_at),
    })),
    parts: parts.rows.map((p) => ({
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
    })),
  };
}
