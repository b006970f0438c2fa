import { randomUUID } from "node:crypto";
import { torquePassCount } from "@/lib/procedures/spec-counts";
import { sql, type Kysely } from "kysely";
import { evaluateTolerance } from "@/lib/calc";
import { formatStamp } from "@/lib/sync/hlc";
import type { Operation } from "@/lib/sync/operations";
import type { Database } from "../schema";
import { saveDynoRun } from "../records/dyno";

// Invented build record and dyno runs for the demo turbo job (work order 1001, Corvid RX1000
// Turbo, GSW-0001): readings, torque passes, parts, sign-offs and reviews, and two dyno runs
// (7 psi before the charge-air rework, 10 psi after). Every figure here is made up for the demo.

interface BuildRecordContext {
  shopId: string;
  workOrderId: string;
  mechanicId: string;
  supervisorId: string;
  /** Day the bench work starts; later records follow it. */
  start: Date;
}

const DEVICE = "demo-tablet-1";

// A timestamptz value for columns whose generated type takes no plain Date on insert.
const ts = (d: Date) => sql<never>`${d.toISOString()}::timestamptz`;

/** One operation row (the append-only record every bench row points at); returns its id. */
async function operation<K extends Operation["kind"]>(
  db: Kysely<Database>,
  ctx: BuildRecordContext,
  kind: K,
  at: Date,
  counter: number,
  payload: Extract<Operation, { kind: K }>["payload"],
) {
  const id = randomUUID();
  await db
    .insertInto("operations")
    .values({
      id,
      shop_id: ctx.shopId,
      work_order_id: ctx.workOrderId,
      kind,
      author_id: ctx.mechanicId,
      device_id: DEVICE,
      device_time: at,
      stamp: formatStamp({ wallMs: at.getTime(), counter, deviceId: DEVICE }),
      payload: JSON.stringify(payload),
    })
    .execute();
  return id;
}

// Readings per spec key, one value per reading label (mm), as typed: the instrument's last digit kept.
const READINGS: Record<string, string[]> = {
  "bore-1": ["76.008", "76.006", "76.007", "76.006", "76.005", "76.005"],
  "ptw-1": ["0.062"],
  "ptw-2": ["0.059"],
  "top-ring-gap": ["0.41", "0.42", "0.40", "0.43"],
  "main-oil-clearance": ["0.028", "0.030", "0.031", "0.029", "0.030"],
  "deck-clearance": ["0.18", "0.20", "0.19", "0.21"],
  "head-warp": ["0.020"],
};

const PARTS = [
  {
    part: "KF-7600-FP",
    description: "Forged pistons, 76.00 mm, 8.8:1 set of 4",
    supplier: "Keelforge Components",
    serial: "KF24-1187 … 1190",
    batch: "B24-331",
  },
  {
    part: "KF-RS76-T",
    description: "Ring set, turbo top-ring material, 76.00 mm",
    supplier: "Keelforge Components",
    serial: null,
    batch: "R24-072",
  },
  { part: "HRD-RB8", description: "Rod bolts, set of 8 (new, stretch type)", supplier: "Harrow Fasteners", serial: null, batch: "HF-5519" },
  {
    part: "MLS-998-070",
    description: "Multi-layer head gasket, 0.70 mm",
    supplier: "Layerline Gaskets",
    serial: "LL-88213",
    batch: "LL-2411",
  },
  {
    part: "CA-IC-320",
    description: "Charge-air cooler core, 320 × 180 mm",
    supplier: "Fenwick Thermal",
    serial: "FT-320-0457",
    batch: null,
  },
];

/** Completes the bottom-end procedure and the head prep stage with readings, torque, parts and reviews. */
export async function seedDemoBuildRecord(
  db: Kysely<Database>,
  ctx: BuildRecordContext,
  parts: readonly (typeof PARTS)[number][] = PARTS,
): Promise<void> {
  const procedures = await db
    .selectFrom("job_procedures as jp")
    .innerJoin("template_versions as tv", "tv.id", "jp.template_version_id")
    .innerJoin("procedure_templates as pt", "pt.id", "tv.template_id")
    .select(["jp.id", "jp.template_version_id as versionId", "pt.key"])
    .where("jp.work_order_id", "=", ctx.workOrderId)
    .execute();
  let minute = 0;
  let counter = 0;
  const at = () => new Date(ctx.start.getTime() + minute++ * 7 * 60_000);

  for (const proc of procedures) {
    const steps = await db
      .selectFrom("template_steps")
      .select(["id", "key", "stage_key"])
      .where("template_version_id", "=", proc.versionId)
      .orderBy("stage_position")
      .orderBy("position")
      .execute();
    // the head procedure is under way: only its first stage is done
    const doneStages = proc.key === "cylinder-head-installation" ? ["head-prep"] : [...new Set(steps.map((s) => s.stage_key))];
    for (const stage of doneStages) {
      for (const step of steps.filter((s) => s.stage_key === stage)) {
        const specs = await db.selectFrom("measurement_specs").selectAll().where("step_id", "=", step.id).execute();
        for (const spec of specs) {
          for (const [i, value] of (READINGS[spec.key] ?? []).entries()) {
            const when = at();
            const verdict = evaluateTolerance(Number(value), {
              unit: spec.unit,
              nominal: spec.nominal === null ? undefined : Number(spec.nominal),
              min: Number(spec.min),
              max: Number(spec.max),
            }).status;
            const stamp = formatStamp({ wallMs: when.getTime(), counter, deviceId: DEVICE });
            const id = await operation(db, ctx, "measurement.recorded", when, counter++, {
              stepId: step.id,
              specId: spec.id,
              readingIndex: i,
              value,
              unit: spec.unit,
            });
            await db
              .insertInto("measurements")
              .values({
                id,
                work_order_id: ctx.workOrderId,
                step_id: step.id,
                spec_id: spec.id,
                reading_index: i,
                value,
                unit: spec.unit,
                verdict,
                recorded_by: ctx.mechanicId,
                device_id: DEVICE,
                device_time: when,
                stamp,
              })
              .execute();
          }
        }
        const torqueSpecs = await db.selectFrom("torque_specs").selectAll().where("step_id", "=", step.id).execute();
        for (const spec of torqueSpecs) {
          const passes = torquePassCount({
            finalValue: Number(spec.final_value),
            unit: spec.unit,
            passes: spec.passes,
            anglePasses: spec.angle_passes,
          });
          for (let pass = 1; pass <= passes; pass++) {
            for (let bolt = 1; bolt <= spec.bolt_count; bolt++) {
              const when = at();
              const id = await operation(db, ctx, "torque.bolt-confirmed", when, counter++, {
                stepId: step.id,
                torqueSpecId: spec.id,
                passIndex: pass,
                bolt,
              });
              await db
                .insertInto("torque_records")
                .values({
                  id,
                  work_order_id: ctx.workOrderId,
                  step_id: step.id,
                  torque_spec_id: spec.id,
                  pass_index: pass,
                  bolt,
                  wrench_reading: null,
                  wrench_unit: null,
                  recorded_by: ctx.mechanicId,
                  device_time: when,
                })
                .execute();
            }
          }
        }
        const when = at();
        const id = await operation(db, ctx, "step.completed", when, counter++, { stepId: step.id });
        await db
          .insertInto("step_completions")
          .values({ id, work_order_id: ctx.workOrderId, step_id: step.id, completed_by: ctx.mechanicId, device_time: when })
          .execute();
      }
      const when = at();
      const signOffId = await operation(db, ctx, "stage.signed-off", when, counter++, { jobProcedureId: proc.id, stageKey: stage });
      await db
        .insertInto("sign_offs")
        .values({
          id: signOffId,
          work_order_id: ctx.workOrderId,
          job_procedure_id: proc.id,
          stage_key: stage,
          signed_by: ctx.mechanicId,
          device_time: when,
        })
        .execute();
      if (stage !== "head-prep") {
        await db
          .insertInto("review_decisions")
          .values({ sign_off_id: signOffId, decision: "approved", decided_by: ctx.supervisorId, decided_at: ts(at()) })
          .execute();
      }
    }
  }
  for (const p of parts) {
    await db
      .insertInto("parts_fitted")
      .values({
        shop_id: ctx.shopId,
        work_order_id: ctx.workOrderId,
        part_number: p.part,
        description: p.description,
        supplier: p.supplier,
        serial: p.serial,
        batch: p.batch,
        fitted_by: ctx.mechanicId,
        fitted_at: ts(at()),
      })
      .execute();
  }
}

/**
 * An invented torque curve for a turbocharged 1000 cc four, N·m at the rpm given: low torque off
 * boost, a rise as the turbo spools around `spoolRpm`, a plateau near `peakNm`, then a fall.
 */
function demoTorqueNm(rpm: number, peakNm: number, spoolRpm: number): number {
  const spool = 1 / (1 + Math.exp(-(rpm - spoolRpm) / 420));
  const fall = 1 - 2e-8 * Math.max(0, rpm - 7200) ** 2;
  const ripple = 0.6 * Math.sin(rpm / 370);
  return Math.round((peakNm * (0.35 + 0.65 * spool) * fall + ripple) * 10) / 10;
}

const demoCurve = (peakNm: number, spoolRpm: number) => {
  const points = [];
  for (let rpm = 3000; rpm <= 10500; rpm += 250) {
    const torque = demoTorqueNm(rpm, peakNm, spoolRpm);
    points.push({ rpm, torque, torqueNm: torque });
  }
  return points;
};

/** The two demo runs: 7 psi baseline, and 10 psi after the charge-air rework. */
async function seedDemoDynoRuns(db: Kysely<Database>, ctx: BuildRecordContext): Promise<void> {
  const base = { boostUnit: "psi" as const, standard: "SAE_J1349" as const, torqueUnit: "N·m" as const, source: "table" as const };
  await saveDynoRun(db, ctx.shopId, ctx.workOrderId, ctx.mechanicId, {
    ...base,
    label: "Baseline 7 psi",
    ranOn: "2026-11-18",
    boostTarget: 7,
    pressureKpa: 100.6,
    temperatureC: 17.5,
    humidityPercent: 62,
    notes: "Exhaust baffle in. Stock charge-air pipework. Three pulls, best shown.",
    points: demoCurve(118, 4700),
  });
  await saveDynoRun(db, ctx.shopId, ctx.workOrderId, ctx.mechanicId, {
    ...base,
    label: "10 psi after charge-air rework",
    ranOn: "2026-11-25",
    boostTarget: 10,
    pressureKpa: 99.2,
    temperatureC: 24,
    humidityPercent: 48,
    notes: "New cooler core and shorter pipework. Exhaust baffle in. Fuel pressure checked before the pulls.",
    points: demoCurve(138, 4400),
  });
}

/** Adds the build record and dyno runs to the demo shop's work order 1001. */
export async function seedDemoDyno(db: Kysely<Database>, shopId: string): Promise<void> {
  const job = await db
    .selectFrom("work_orders")
    .select(["id", "assigned_mechanic_id"])
    .where("shop_id", "=", shopId)
    .where("number", "=", 1001)
    .executeTakeFirstOrThrow();
  const supervisor = await db
    .selectFrom("users")
    .select("id")
    .where("shop_id", "=", shopId)
    .where("role", "=", "supervisor")
    .orderBy("email")
    .executeTakeFirstOrThrow();
  const ctx = {
    shopId,
    workOrderId: job.id,
    mechanicId: job.assigned_mechanic_id!,
    supervisorId: supervisor.id,
    start: new Date("2026-11-10T08:30:00Z"),
  };
  // The office demo data already lists the pistons, rings and rod bolts of this job; add the rest.
  await seedDemoBuildRecord(
    db,
    ctx,
    PARTS.filter((p) => ["MLS-998-070", "CA-IC-320"].includes(p.part)),
  );
  await seedDemoDynoRuns(db, ctx);
}
