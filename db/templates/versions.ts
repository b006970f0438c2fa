import "server-only";
import type { Kysely, Transaction } from "kysely";
import { templateDocumentSchema, type TemplateDocumentInput } from "@/lib/procedures/template-schema";
import type { Database } from "../schema";
import { holdKeys } from "../setup/key-locks";

type Db = Kysely<Database> | Transaction<Database>;

// Writes a template document as a new immutable version (version 1 for a new key).
// Validates first; writes everything in one transaction so nothing is half-imported.
export async function createTemplateVersion(
  db: Db,
  shopId: string,
  input: TemplateDocumentInput,
  createdBy: string | null,
): Promise<{ templateId: string; versionId: string; version: number }> {
  const doc = templateDocumentSchema.parse(input);
  // Inside a caller's transaction (a bundle import) the version joins it; otherwise it has its own.
  const run = async (trx: Transaction<Database>) => {
    // a new template's key is claimed one request at a time (two imports of the same file at once)
    await holdKeys(trx, [`template-key:${shopId}:${doc.key}`]);
    const existing = await trx
      .selectFrom("procedure_templates")
      .select("id")
      .where("shop_id", "=", shopId)
      .where("key", "=", doc.key)
      .forUpdate()
      .executeTakeFirst();
    const templateId =
      existing?.id ??
      (
        await trx
          .insertInto("procedure_templates")
          .values({ shop_id: shopId, key: doc.key, name: doc.name })
          .returning("id")
          .executeTakeFirstOrThrow()
      ).id;
    if (existing) await trx.updateTable("procedure_templates").set({ name: doc.name }).where("id", "=", templateId).execute();
    const last = await trx
      .selectFrom("template_versions")
      .select((eb) => eb.fn.max("version").as("v"))
      .where("template_id", "=", templateId)
      .executeTakeFirst();
    const version = (last?.v ?? 0) + 1;
    const { id: versionId } = await trx
      .insertInto("template_versions")
      .values({
        template_id: templateId,
        version,
        name: doc.name,
        summary: doc.summary,
        example_only: doc.exampleOnly,
        created_by: createdBy,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await writeSteps(trx, versionId, doc.stages);
    return { templateId, versionId, version };
  };
  return db.isTransaction ? run(db as Transaction<Database>) : (db as Kysely<Database>).transaction().execute(run);
}

async function writeSteps(trx: Db, versionId: string, stages: ReturnType<typeof templateDocumentSchema.parse>["stages"]): Promise<void> {
  for (const [stagePosition, stage] of stages.entries()) {
    for (const [position, step] of stage.steps.entries()) {
      const { id: stepId } = await trx
        .insertInto("template_steps")
        .values({
          template_version_id: versionId,
          stage_key: stage.key,
          stage_title: stage.title,
          stage_position: stagePosition,
          position,
          key: step.key,
          title: step.title,
          instructions: step.instructions,
          cautions: JSON.stringify(step.cautions),
          requires_photo: step.requiresPhoto,
          waits_for_step_key: null,
        })
        .returning("id")
        .executeTakeFirstOrThrow();
      if (step.torque.length) {
        await trx
          .insertInto("torque_specs")
          .values(
            step.torque.map((t) => ({
              step_id: stepId,
              label: t.label,
              final_value: t.finalValue,
              unit: t.unit,
              passes: JSON.stringify(t.passes),
              angle_passes: JSON.stringify(t.anglePasses),
              pattern: t.pattern,
              bolt_count: t.boltCount,
              lubricant: t.lubricant,
              torque_to_yield: t.torqueToYield,
            })),
          )
          .execute();
      }
      if (step.measurements.length) {
        await trx
          .insertInto("measurement_specs")
          .values(
            step.measurements.map((m) => ({
              step_id: stepId,
              key: m.key,
              label: m.label,
              nominal: m.nominal,
              min: m.min,
              max: m.max,
              unit: m.unit,
              reading_labels: m.readingLabels,
              geometry: m.geometry,
            })),
          )
          .execute();
      }
      if (step.timer) {
        await trx
          .insertInto("timer_specs")
          .values({
            step_id: stepId,
            label: step.timer.label,
            duration_s: step.timer.durationS,
            blocks_step_key: step.timer.blocksStepKey,
          })
          .execute();
      }
    }
  }
}

// The latest version of each template in a shop.
export async function latestTemplateVersions(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("template_versions as v")
    .innerJoin("procedure_templates as t", "t.id", "v.template_id")
    .select(["t.id as templateId", "t.key", "v.id as versionId", "v.version", "v.name", "v.example_only as exampleOnly"])
    .where("t.shop_id", "=", shopId)
    .where(({ not, exists, selectFrom }) =>
      not(
        exists(
          selectFrom("template_versions as later")
            .select("later.id")
            .whereRef("later.template_id", "=", "v.template_id")
            .whereRef("later.version", ">", "v.version"),
        ),
      ),
    )
    .orderBy("t.key")
    .execute();
}
