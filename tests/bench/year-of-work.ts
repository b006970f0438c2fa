// A generated year of a busy shop, for benchmarks: jobs worked on simulated tablets and merged by the
// project's own sync merge (mergeBatch: operations, sign-offs, the audit log), decided by the
// project's own review (decideOnSignOff). Only the jobs themselves (a work order with the two fixture
// procedures pinned, like tests/integration/support/shop-fixture.ts) are written directly.
import type { Kysely } from "kysely";
import type { Database } from "@/db/schema";
import { decideOnSignOff } from "@/db/review/decide";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { decisionInputSchema } from "@/lib/review/decision-input";
import type { Operation } from "@/lib/sync/operations";
import { createShopFixture, type ShopFixture } from "../integration/support/shop-fixture";
import { Tablet } from "./sync-ops";

export interface YearSize {
  jobs: number;
  /** Operations per job (about: a job's stages are worked whole). */
  operationsPerJob: number;
  /** Sign-offs left without a decision, the newest ones. */
  waiting: number;
}

/** A year of a busy shop (issue 17): 2,008 jobs, about 212,000 operations, about 9,500 sign-offs, 299 waiting. */
export const YEAR: YearSize = { jobs: 2_008, operationsPerJob: 105, waiting: 299 };

interface Stage {
  jobProcedureId: string;
  stageKey: string;
  steps: { id: string; held: boolean }[];
  specs: { id: string; stepId: string; readings: number; good: number; high: number }[];
}

export interface GeneratedShop {
  fx: ShopFixture;
  workOrderIds: string[];
  operations: number;
  signOffs: number;
  decided: number;
  mechanic: SessionUser;
  supervisor: SessionUser;
}

const asUser = (u: ShopFixture["users"]["mechanic"]): SessionUser => ({ ...u, customerId: null });
const round3 = (x: number) => Math.round(x * 1000) / 1000;

async function stagesOf(db: Kysely<Database>, fx: ShopFixture, workOrderId: string): Promise<Stage[]> {
  const procedures = await db
    .selectFrom("job_procedures")
    .select(["id", "template_version_id"])
    .where("work_order_id", "=", workOrderId)
    .orderBy("position")
    .execute();
  const steps = await db
    .selectFrom("template_steps")
    .select(["id", "key", "stage_key", "stage_position", "position", "template_version_id"])
    .where("template_version_id", "in", [fx.templates.bottom.versionId, fx.templates.head.versionId])
    .orderBy("stage_position")
    .orderBy("position")
    .execute();
  const held = new Set(
    (await db.selectFrom("timer_specs").select("blocks_step_key").where("blocks_step_key", "is not", null).execute()).map(
      (t) => t.blocks_step_key,
    ),
  );
  const specs = await db
    .selectFrom("measurement_specs")
    .select(["id", "step_id", "min", "max", "reading_labels"])
    .where(
      "step_id",
      "in",
      steps.map((s) => s.id),
    )
    .execute();
  const out: Stage[] = [];
  for (const p of procedures) {
    for (const s of steps.filter((x) => x.template_version_id === p.template_version_id)) {
      let stage = out.find((x) => x.jobProcedureId === p.id && x.stageKey === s.stage_key);
      if (!stage) out.push((stage = { jobProcedureId: p.id, stageKey: s.stage_key, steps: [], specs: [] }));
      stage.steps.push({ id: s.id, held: held.has(s.key) });
      for (const m of specs.filter((x) => x.step_id === s.id)) {
        const [min, max] = [Number(m.min), Number(m.max)];
        stage.specs.push({
          id: m.id,
          stepId: s.id,
          readings: Math.max(1, m.reading_labels.length),
          good: round3((min + max) / 2),
          high: round3(max + Math.max(0.001, (max - min) / 2)),
        });
      }
    }
  }
  return out;
}

/** One job's work on its own tablet: each stage read, completed and signed off, with re-readings first to make up about `count` operations. */
function jobWork(tablet: Tablet, stages: Stage[], count: number, outOfTolerance: boolean) {
  const ops: Operation[] = [];
  const signOffs: Operation[] = [];
  const perPass = stages.reduce((n, s) => n + s.specs.reduce((k, x) => k + x.readings, 0) + s.steps.filter((x) => !x.held).length + 1, 0);
  const first = stages.find((s) => s.specs.length > 0)!.specs[0];
  for (let i = 0; i < count - perPass; i++) ops.push(tablet.read(first.stepId, first.id, i % first.readings, first.good));
  for (const stage of stages) {
    stage.specs.forEach((spec, k) => {
      for (let i = 0; i < spec.readings; i++)
        ops.push(tablet.read(spec.stepId, spec.id, i, outOfTolerance && k === 0 && i === 0 ? spec.high : spec.good));
    });
    for (const step of stage.steps) if (!step.held) ops.push(tablet.complete(step.id));
    const signOff = tablet.make("stage.signed-off", { jobProcedureId: stage.jobProcedureId, stageKey: stage.stageKey });
    ops.push(signOff);
    signOffs.push(signOff);
  }
  return { ops, signOffs };
}

/** Approve a sign-off, letting every reading out of tolerance stand and accepting every flagged entry the review names. */
async function approve(db: Kysely<Database>, sup: SessionUser, signOffId: string) {
  let input = decisionInputSchema.parse({ decision: "approved", expectedDecisionId: null });
  for (let attempt = 0; attempt < 2; attempt++) {
    const r = await decideOnSignOff(db, sup, signOffId, input);
    if (r.ok) return;
    const named = (prefix: string) => r.issues.filter((i) => i.path.startsWith(prefix)).map((i) => i.path.slice(prefix.length));
    const justification = "Checked on the bench by the supervisor";
    input = decisionInputSchema.parse({
      decision: "approved",
      expectedDecisionId: null,
      acceptances: named("reading.").map((readingId) => ({ readingId, justification })),
      flagAcceptances: named("flagged.").map((operationId) => ({ operationId, justification })),
    });
  }
  throw new Error(`approval of ${signOffId} refused twice`);
}

/** Runs `f` over `items`, `width` at a time. */
async function inParallel<T>(items: readonly T[], width: number, f: (x: T) => Promise<void>) {
  let next = 0;
  await Promise.all(
    Array.from({ length: width }, async () => {
      while (next < items.length) await f(items[next++]);
    }),
  );
}

/**
 * A shop with `size.jobs` jobs worked and signed off through the merge; every sign-off is decided
 * (approved) except the newest `size.waiting`; one waiting job in three has a reading out of tolerance.
 * `progress` hears how far it got.
 */
export async function generateShop(db: Kysely<Database>, size: YearSize, progress: (s: string) => void = () => {}): Promise<GeneratedShop> {
  const fx = await createShopFixture(db);
  const mechanic = asUser(fx.users.mechanic);
  const supervisor = asUser(fx.users.supervisor);
  const workOrderIds = [fx.workOrderId];
  for (let n = 2; n <= size.jobs; n++) {
    const wo = await db
      .insertInto("work_orders")
      .values({
        shop_id: fx.shopId,
        bike_id: fx.bike.id,
        number: n,
        title: `Rebuild ${n}`,
        status: "in_build",
        intake_odometer_km: 1000 + n,
        assigned_mechanic_id: mechanic.id,
        closed_at: null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    for (const [position, v] of [fx.templates.bottom, fx.templates.head].entries())
      await db.insertInto("job_procedures").values({ work_order_id: wo.id, template_version_id: v.versionId, position }).execute();
    workOrderIds.push(wo.id);
  }
  const signOffIds: string[] = [];
  let operations = 0;
  // the jobs whose sign-offs stay waiting (a job signs off a few stages); one in three of them with a reading out of tolerance
  const late = workOrderIds.slice(-Math.ceil(size.waiting / 3));
  for (const [j, id] of workOrderIds.entries()) {
    const stages = await stagesOf(db, fx, id);
    const tablet = new Tablet(`bay-${j}`, mechanic.id, id);
    const work = jobWork(tablet, stages, size.operationsPerJob, late.indexOf(id) % 3 === 0);
    const r = await mergeBatch(db, mechanic, tablet.batch(work.ops));
    if (r.accepted.length !== work.ops.length) throw new Error(`job ${j}: ${JSON.stringify(r.refused.slice(0, 2))}`);
    operations += work.ops.length;
    signOffIds.push(...work.signOffs.map((s) => s.id));
    if (j % 200 === 199) progress(`${j + 1} jobs merged, ${operations.toLocaleString("en")} operations`);
  }
  const toDecide = signOffIds.slice(0, Math.max(0, signOffIds.length - size.waiting));
  let decided = 0;
  await inParallel(toDecide, 3, async (id) => {
    await approve(db, supervisor, id);
    if (++decided % 1000 === 0) progress(`${decided.toLocaleString("en")} sign-offs decided`);
  });
  return { fx, workOrderIds, operations, signOffs: signOffIds.length, decided, mechanic, supervisor };
}
