import "server-only";
import type { Kysely } from "kysely";
import {
  buildFiguresFromReadings,
  EMPTY_BUILD_SHEET,
  readStoredSheet,
  readingKindOf,
  type BuildReading,
  type BuildSheet,
} from "@/lib/build-figures";
import { intercoolerFromRuns } from "@/lib/build-figures/intercooler-from-run";
import { boostTargetKpa } from "@/lib/dyno/boost";
import { countingRuns } from "@/lib/dyno/run-withdrawal";
import type { StoredDynoRun } from "@/lib/dyno/run-summary";
import { closedRecordRefusal } from "@/lib/work-orders/closed-record";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";
import { listDynoRuns } from "./dyno";

// A work order's build sheet (lib/build-figures/build-sheet.ts; table build_sheets, append-only:
// each save is a new row, the newest is current) and the build's own figures worked out from the
// job's current readings.

/** The newest build sheet of the work order, with who saved it and when; null when none was saved. */
export async function currentBuildSheet(db: Kysely<Database>, shopId: string, workOrderId: string) {
  const row = await db
    .selectFrom("build_sheets as s")
    .innerJoin("users as u", "u.id", "s.created_by")
    .select(["s.id", "s.figures", "u.name as savedBy", "s.created_at as savedAt"])
    .where("s.shop_id", "=", shopId)
    .where("s.work_order_id", "=", workOrderId)
    .orderBy("s.created_at", "desc")
    .orderBy("s.id", "desc")
    .limit(1)
    .executeTakeFirst();
  if (!row) return null;
  return { id: row.id, sheet: readStoredSheet(row.figures), savedBy: row.savedBy, savedAt: row.savedAt.toISOString() };
}

/**
 * Saves a checked sheet as the work order's newest, with its audit entry, in one transaction.
 * Refused (409, audit entry kept) once the job's record is closed: the sheet's targets are in the
 * handover report. null when the work order is not this shop's.
 */
export async function saveBuildSheet(
  db: Kysely<Database>,
  user: { id: string; shopId: string },
  workOrderId: string,
  sheet: BuildSheet,
): Promise<{ ok: true; id: string } | { ok: false; refused: string } | null> {
  return db.transaction().execute(async (trx) => {
    const job = await trx
      .selectFrom("work_orders")
      .select(["id", "number", "status"])
      .where("shop_id", "=", user.shopId)
      .where("id", "=", workOrderId)
      .forShare()
      .executeTakeFirst();
    if (!job) return null;
    const audit = { shopId: user.shopId, actorId: user.id, action: "build-sheet.saved", entity: "build_sheet", workOrderId };
    const refused = closedRecordRefusal(job, "build sheet");
    if (refused) {
      await appendAudit(trx, [{ ...audit, outcome: "refused", reason: refused }]);
      return { ok: false as const, refused };
    }
    const { id } = await trx
      .insertInto("build_sheets")
      .values({ shop_id: user.shopId, work_order_id: workOrderId, figures: JSON.stringify(sheet), created_by: user.id })
      .returning("id")
      .executeTakeFirstOrThrow();
    await appendAudit(trx, [
      {
        ...audit,
        entityId: id,
        outcome: "accepted",
        detail: { figures: Object.keys(sheet.figures).length, mapOutline: sheet.mapOutline !== null },
      },
    ]);
    return { ok: true as const, id };
  });
}

/**
 * The work order's current readings that feed the build figures (spec keys bore, stroke,
 * chamber-volume, deck-clearance, gasket-thickness…), read from current_measurements like every
 * other screen; optionally only those of one stage.
 */
export async function buildReadingsOf(
  db: Kysely<Database>,
  workOrderId: string,
  stage?: { jobProcedureId: string; stageKey: string },
): Promise<BuildReading[]> {
  let q = db
    .selectFrom("current_measurements as m")
    .innerJoin("measurement_specs as s", "s.id", "m.spec_id")
    .innerJoin("template_steps as t", "t.id", "m.step_id")
    .select(["s.key as specKey", "m.value", "m.unit"])
    .where("m.work_order_id", "=", workOrderId);
  if (stage) {
    q = q
      .innerJoin("job_procedures as jp", "jp.template_version_id", "t.template_version_id")
      .where("jp.id", "=", stage.jobProcedureId)
      .where("t.stage_key", "=", stage.stageKey);
  }
  const rows = await q.execute();
  return rows.filter((r) => readingKindOf(r.specKey) !== null).map((r) => ({ specKey: r.specKey, value: Number(r.value), unit: r.unit }));
}

/** The build's own figures of a work order: its current readings and its saved sheet, with `boostKpa` when no sheet boost is saved. */
export async function buildFiguresOf(db: Kysely<Database>, shopId: string, workOrderId: string, boostKpa: number | null) {
  const [saved, readings] = await Promise.all([currentBuildSheet(db, shopId, workOrderId), buildReadingsOf(db, workOrderId)]);
  const sheet = saved?.sheet ?? EMPTY_BUILD_SHEET;
  return { saved, sheet, figures: buildFiguresFromReadings({ readings, sheet, boostKpa: sheet.figures.boostKpa ?? boostKpa }) };
}

/** Boost target of the newest counting run, kPa gauge, with the run; null without runs. */
export function newestRunBoost(runs: readonly StoredDynoRun[]) {
  const newest = countingRuns(runs).at(-1);
  return newest
    ? { kpa: boostTargetKpa(newest.boostTarget, newest.boostUnit), label: newest.label, value: newest.boostTarget, unit: newest.boostUnit }
    : null;
}

/**
 * Everything the job's "turbo and fuel figures" and build figures read: the bike's displacement,
 * the boost target of the newest counting dyno run, the saved sheet, the figures from the readings,
 * and the intercooler rated from logged channels when a run has them. null when not this shop's job.
 */
export async function loadBuildNumbers(db: Kysely<Database>, shopId: string, workOrderId: string) {
  const job = await db
    .selectFrom("work_orders as w")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .select(["w.id", "b.displacement_cc as displacementCc"])
    .where("w.shop_id", "=", shopId)
    .where("w.id", "=", workOrderId)
    .executeTakeFirst();
  if (!job) return null;
  const runs = countingRuns(await listDynoRuns(db, shopId, workOrderId));
  const dynoBoost = newestRunBoost(runs);
  const { saved, sheet, figures } = await buildFiguresOf(db, shopId, workOrderId, dynoBoost?.kpa ?? null);
  return { displacementCc: job.displacementCc, dynoBoost, saved, sheet, figures, intercooler: intercoolerFromRuns(runs) };
}

/**
 * The build's figures for the review of a sign-off, when its stage holds readings that feed them
 * (bore, chamber volume, deck …); null otherwise or when the sign-off is not this shop's. The figures
 * are worked from all the job's current readings (a chamber may be measured in another stage).
 */
export async function buildFiguresForSignOff(db: Kysely<Database>, shopId: string, signOffId: string) {
  const so = await db
    .selectFrom("sign_offs as so")
    .innerJoin("work_orders as w", "w.id", "so.work_order_id")
    .select(["so.work_order_id as workOrderId", "so.job_procedure_id as jobProcedureId", "so.stage_key as stageKey"])
    .where("so.id", "=", signOffId)
    .where("w.shop_id", "=", shopId)
    .executeTakeFirst();
  if (!so) return null;
  const inStage = await buildReadingsOf(db, so.workOrderId, { jobProcedureId: so.jobProcedureId, stageKey: so.stageKey });
  if (inStage.length === 0) return null;
  const runs = countingRuns(await listDynoRuns(db, shopId, so.workOrderId));
  return (await buildFiguresOf(db, shopId, so.workOrderId, newestRunBoost(runs)?.kpa ?? null)).figures;
}
