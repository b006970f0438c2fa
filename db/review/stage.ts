import "server-only";
import { isWithdrawn } from "../records/withdrawn";
import { sql, type Kysely, type Transaction } from "kysely";
import { readingLabelOf } from "@/lib/review/stage-review";
import { describeEntry, isStage, placeOfEntry, type FlaggedEntry } from "@/lib/review/flagged-work";
import { flaggedEntriesOf, placeLookups } from "./flagged-work";
import type { Database } from "../schema";

// Facts about one signed-off stage that the decision and the e-mail notice both need.

type Db = Kysely<Database> | Transaction<Database>;

export interface StageOutOfTolerance {
  readingId: string;
  stepId: string;
  stepTitle: string;
  description: string;
  value: string;
  unit: string;
  verdict: "low" | "high";
  min: string;
  max: string;
  accepted: boolean;
  /** Who recorded the reading (nobody lets their own reading stand). */
  recordedBy: string;
}

/** The sign-off, its job and stage title, when it belongs to the shop; undefined otherwise. */
export async function signOffInShop(db: Db, shopId: string, signOffId: string) {
  return db
    .selectFrom("sign_offs as s")
    .innerJoin("work_orders as w", "w.id", "s.work_order_id")
    .innerJoin("job_procedures as jp", "jp.id", "s.job_procedure_id")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .select([
      "s.id",
      "s.work_order_id as workOrderId",
      "s.job_procedure_id as jobProcedureId",
      "s.stage_key as stageKey",
      "s.signed_by as signedBy",
      "s.device_time as deviceTime",
      "jp.template_version_id as templateVersionId",
      "w.number",
      "w.status",
      "w.title",
      "b.make",
      "b.model",
      "b.tag_code as tagCode",
      (eb) =>
        eb
          .selectFrom("template_steps as ts")
          .select("ts.stage_title")
          .whereRef("ts.template_version_id", "=", "jp.template_version_id")
          .whereRef("ts.stage_key", "=", "s.stage_key")
          .limit(1)
          .as("stageTitle"),
      isWithdrawn("s.id").as("withdrawn"),
    ])
    .where("s.id", "=", signOffId)
    .where("w.shop_id", "=", shopId)
    .executeTakeFirst();
}

/** The steps of a stage of a pinned template version, in order. */
export async function stageSteps(db: Db, templateVersionId: string, stageKey: string) {
  return db
    .selectFrom("template_steps")
    .select(["id", "title"])
    .where("template_version_id", "=", templateVersionId)
    .where("stage_key", "=", stageKey)
    .orderBy("position")
    .execute();
}

/** Current readings of the stage's steps on the job that are out of tolerance, with whether each is accepted. */
export async function stageOutOfTolerance(
  db: Db,
  workOrderId: string,
  templateVersionId: string,
  stageKey: string,
): Promise<StageOutOfTolerance[]> {
  const r = await sql<{
    id: string;
    step_id: string;
    step_title: string;
    label: string;
    reading_labels: string[];
    reading_index: number;
    value: string;
    unit: string;
    verdict: "low" | "high";
    min: string;
    max: string;
    accepted: boolean;
    recorded_by: string;
  }>`
    SELECT cm.id, cm.step_id, ts.title AS step_title, ms.label, ms.reading_labels, cm.reading_index, cm.value::text AS value,
      cm.unit, cm.verdict, ms.min::text AS min, ms.max::text AS max, cm.recorded_by,
      EXISTS (SELECT 1 FROM reading_acceptances a WHERE a.measurement_id = cm.id) AS accepted
    FROM current_measurements cm
    JOIN template_steps ts ON ts.id = cm.step_id
    JOIN measurement_specs ms ON ms.id = cm.spec_id
    WHERE cm.work_order_id = ${workOrderId}::uuid AND ts.template_version_id = ${templateVersionId}::uuid
      AND ts.stage_key = ${stageKey} AND cm.verdict <> 'in'
    ORDER BY ts.position, ms.key, cm.reading_index
  `.execute(db);
  return r.rows.map((x) => ({
    readingId: x.id,
    stepId: x.step_id,
    stepTitle: x.step_title,
    description: `${x.reading_labels.length ? `${x.label}, ${readingLabelOf(x.reading_labels, x.reading_index)}` : x.label}: ${x.value} ${x.unit} (${x.verdict}; limits ${x.min}–${x.max} ${x.unit})`,
    value: x.value,
    unit: x.unit,
    verdict: x.verdict,
    min: x.min,
    max: x.max,
    accepted: x.accepted,
    recordedBy: x.recorded_by,
  }));
}

/** The newest sign-off of the stage (by change sequence). */
export async function latestSignOffOfStage(db: Db, jobProcedureId: string, stageKey: string): Promise<string | undefined> {
  const r = await sql<{ id: string }>`
    SELECT s.id FROM sign_offs s JOIN operations o ON o.id = s.id
    WHERE s.job_procedure_id = ${jobProcedureId}::uuid AND s.stage_key = ${stageKey}
    ORDER BY o.seq DESC LIMIT 1
  `.execute(db);
  return r.rows[0]?.id;
}

/** The decision standing on a sign-off (the newest), if any. */
export async function latestDecisionOn(db: Db, signOffId: string) {
  return db
    .selectFrom("review_decisions")
    .select(["id", "decision", "decided_by as decidedBy", "decided_at as decidedAt"])
    .where("sign_off_id", "=", signOffId)
    .orderBy("change_seq", "desc")
    .limit(1)
    .executeTakeFirst();
}

export interface StageFlaggedEntry extends FlaggedEntry {
  /** "Reading (76.02 mm)" and where: the entry in words. */
  description: string;
  stepId: string | null;
  /** Not placed on any stage of the job (shown and accepted on every stage's review). */
  onNoStage: boolean;
}

/**
 * The flagged entries of a signed-off stage (lib/review/flagged-work.ts places each entry, of any
 * kind, on its stage), plus the job's flagged entries that belong to no stage; accepted ones too.
 */
export async function stageFlaggedEntries(
  db: Db,
  shopId: string,
  so: { workOrderId: string; jobProcedureId: string; stageKey: string },
): Promise<StageFlaggedEntry[]> {
  const entries = await flaggedEntriesOf(db, shopId, [so.workOrderId]);
  const lookup = (await placeLookups(db, entries)).get(so.workOrderId);
  if (!lookup || lookup.stageOfStep.size === 0) return [];
  const titles = new Map(
    (
      await db
        .selectFrom("template_steps")
        .select(["id", "title"])
        .where("id", "in", [...lookup.stageOfStep.keys()])
        .execute()
    ).map((t) => [t.id, t.title]),
  );
  const out: StageFlaggedEntry[] = [];
  for (const e of entries.get(so.workOrderId) ?? []) {
    const place = placeOfEntry(e, lookup);
    const here = isStage(place.stage, so);
    if (!here && place.stage) continue;
    const step = place.stepId ? titles.get(place.stepId) : undefined;
    out.push({
      ...e,
      stepId: place.stepId,
      onNoStage: !place.stage,
      description: `${describeEntry(e.kind, e.payload)}${step ? ` at “${step}”` : ""}`,
    });
  }
  return out;
}

/**
 * Work recorded on the stage after `seenUpTo` (the record a supervisor's review screen showed),
 * described in workshop words: a decision made on a screen without it is refused. Operations of a
 * shop are written under its sync lock, so their order in the sequence is their order of commit.
 */
export async function stageWorkSince(
  db: Db,
  so: { workOrderId: string; jobProcedureId: string; stageKey: string },
  seenUpTo: string,
): Promise<string[]> {
  const since = await db
    .selectFrom("operations")
    .select(["id", "kind", "payload"])
    .where("work_order_id", "=", so.workOrderId)
    .where("seq", ">", seenUpTo)
    .orderBy("seq")
    .execute();
  if (since.length === 0) return [];
  const lookup = (await placeLookups(db as Kysely<Database>, new Map([[so.workOrderId, since]]))).get(so.workOrderId)!;
  return since.filter((o) => isStage(placeOfEntry(o, lookup).stage, so)).map((o) => describeEntry(o.kind, o.payload));
}
