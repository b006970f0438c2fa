import "server-only";
import type { Kysely, Selectable } from "kysely";
import { templateDocumentSchema, type TemplateDocument, type TemplateDocumentInput } from "@/lib/procedures/template-schema";
import { createTemplateVersion } from "./versions";
import type { Database } from "../schema";

// Every template of a shop with all its versions, newest first.
export async function templatesWithVersions(db: Kysely<Database>, shopId: string) {
  const rows = await db
    .selectFrom("template_versions as v")
    .innerJoin("procedure_templates as t", "t.id", "v.template_id")
    .leftJoin("users as u", "u.id", "v.created_by")
    .select([
      "t.id as templateId",
      "t.key",
      "v.id as versionId",
      "v.version",
      "v.name",
      "v.example_only as exampleOnly",
      "v.created_at as createdAt",
      "u.name as createdByName",
    ])
    .where("t.shop_id", "=", shopId)
    .orderBy("t.key")
    .orderBy("v.version", "desc")
    .execute();
  const byKey = new Map<string, { key: string; templateId: string; versions: typeof rows }>();
  for (const r of rows) {
    const e = byKey.get(r.key) ?? { key: r.key, templateId: r.templateId, versions: [] };
    e.versions.push(r);
    byKey.set(r.key, e);
  }
  return [...byKey.values()];
}

const num = (v: string | null) => (v === null ? null : Number(v));

// A stored version as our own template document (the export format). Latest when version is omitted.
export async function loadTemplateDocument(
  db: Kysely<Database>,
  shopId: string,
  key: string,
  version?: number,
): Promise<TemplateDocument | null> {
  let q = db
    .selectFrom("template_versions as v")
    .innerJoin("procedure_templates as t", "t.id", "v.template_id")
    .select(["v.id", "v.name", "v.summary", "v.example_only", "t.key"])
    .where("t.shop_id", "=", shopId)
    .where("t.key", "=", key);
  q = version ? q.where("v.version", "=", version) : q.orderBy("v.version", "desc");
  const v = await q.executeTakeFirst();
  if (!v) return null;
  const steps = await db
    .selectFrom("template_steps")
    .selectAll()
    .where("template_version_id", "=", v.id)
    .orderBy("stage_position")
    .orderBy("position")
    .execute();
  const stepIds = steps.map((s) => s.id);
  const none = ["00000000-0000-0000-0000-000000000000"];
  const [torque, meas, timers] = await Promise.all([
    db
      .selectFrom("torque_specs")
      .selectAll()
      .where("step_id", "in", stepIds.length ? stepIds : none)
      .orderBy("id")
      .execute(),
    db
      .selectFrom("measurement_specs")
      .selectAll()
      .where("step_id", "in", stepIds.length ? stepIds : none)
      .execute(),
    db
      .selectFrom("timer_specs")
      .selectAll()
      .where("step_id", "in", stepIds.length ? stepIds : none)
      .execute(),
  ]);
  const stages: TemplateDocumentInput["stages"] = [];
  for (const s of steps) {
    let stage = stages.find((x) => x.key === s.stage_key);
    if (!stage) {
      stage = { key: s.stage_key, title: s.stage_title, steps: [] as unknown as TemplateDocumentInput["stages"][number]["steps"] };
      stages.push(stage);
    }
    const timer = timers.find((t) => t.step_id === s.id);
    stage.steps.push({
      key: s.key,
      title: s.title,
      instructions: s.instructions,
      cautions: s.cautions,
      requiresPhoto: s.requires_photo,
      torque: torque.filter((t) => t.step_id === s.id).map(torqueSpecOfRow),
      measurements: meas
        .filter((m) => m.step_id === s.id)
        .map((m) => ({
          key: m.key,
          label: m.label,
          nominal: num(m.nominal),
          min: Number(m.min),
          max: Number(m.max),
          unit: m.unit,
          readingLabels: m.reading_labels,
          geometry: m.geometry,
        })),
      timer: timer ? { label: timer.label, durationS: timer.duration_s, blocksStepKey: timer.blocks_step_key } : null,
    });
  }
  return templateDocumentSchema.parse({
    format: "benchtag-template",
    formatVersion: 1,
    key: v.key,
    name: v.name,
    summary: v.summary,
    exampleOnly: v.example_only,
    stages,
  });
}

// Imports validated documents as new versions, all in one transaction: every one or none.
export async function importTemplateDocuments(db: Kysely<Database>, shopId: string, userId: string, docs: TemplateDocument[]) {
  return db.transaction().execute(async (trx) => {
    const out = [];
    for (const d of docs) out.push({ key: d.key, ...(await createTemplateVersion(trx, shopId, d, userId)) });
    return out;
  });
}

/** A stored torque spec as the template document writes it (the bench's snapshot adds its id). */
export function torqueSpecOfRow(t: Selectable<Database["torque_specs"]>) {
  return {
    label: t.label,
    finalValue: Number(t.final_value),
    unit: t.unit,
    passes: t.passes,
    anglePasses: t.angle_passes,
    pattern: t.pattern,
    boltCount: t.bolt_count,
    lubricant: t.lubricant,
    torqueToYield: t.torque_to_yield,
  };
}
