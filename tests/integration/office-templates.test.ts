import { describe, expect, it } from "vitest";
import { importTemplateDocuments, loadTemplateDocument, templatesWithVersions } from "@/db/templates/documents";
import { GET as exportTemplate } from "@/app/api/office/templates/[key]/route";
import { createTemplateVersion } from "@/db/templates/versions";
import { DEMO_TEMPLATES } from "@/lib/procedures/demo-templates";
import { firstStartTemplate } from "@/lib/procedures/demo-templates/first-start";
import { turboKitTemplate } from "@/lib/procedures/demo-templates/turbo-kit";
import { readTemplateFile } from "@/lib/procedures/template-file";
import { templateDocumentSchema } from "@/lib/procedures/template-schema";
import { createShopFixture } from "./support/shop-fixture";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
const count = async (table: "template_versions" | "template_steps" | "procedure_templates") =>
  Number(
    (
      await db
        .selectFrom(table)
        .select((eb) => eb.fn.countAll<number>().as("n"))
        .executeTakeFirstOrThrow()
    ).n,
  );

describe("template export and import", () => {
  it("exports a stored version as the same document that was imported (round trip)", async () => {
    const fx = await createShopFixture(db);
    await createTemplateVersion(db, fx.shopId, turboKitTemplate, fx.users.office.id);
    const exported = await loadTemplateDocument(db, fx.shopId, "turbo-kit-intercooler");
    expect(exported).toEqual(templateDocumentSchema.parse(turboKitTemplate));
    // and the exported text reads back cleanly
    const again = readTemplateFile(JSON.stringify(exported));
    expect(again).toEqual({ ok: true, documents: [exported] });
  });

  it("the export route answers a key no template can have, or a version past any number stored, in words, not as a server error", async () => {
    const fx = await createShopFixture(db);
    await createTemplateVersion(db, fx.shopId, turboKitTemplate, fx.users.office.id);
    const user = { ...fx.users.office, customerId: null };
    const get = async (key: string, query = "") => {
      const res = await exportTemplate.handle(appRequest(`/api/office/templates/x${query}`), { user, db, params: { key } });
      return [
        res.status,
        res.status === 200 ? ((await res.json()) as { key: string }).key : ((await res.json()) as { error: string; issues: unknown[] }),
      ];
    };
    expect(await get("turbo-kit-intercooler", "?version=1")).toEqual([200, "turbo-kit-intercooler"]);
    for (const key of ["%E0%A4%A", "turbo\u0000kit", "Turbo Kit", "x".repeat(64)])
      expect(await get(key)).toEqual([404, { error: "No such template or version.", issues: [] }]);
    expect(await get("turbo-kit-intercooler", "?version=99999999999")).toEqual([
      400,
      { error: "Check the marked fields.", issues: [{ path: "version", message: "Version: must be at most 2147483647" }] },
    ]);
    expect(await get("turbo-kit-intercooler", "?version=2")).toEqual([404, { error: "No such template or version.", issues: [] }]);
  });

  it("editing makes a new version; a job keeps the version it was started with", async () => {
    const fx = await createShopFixture(db);
    const v1 = await createTemplateVersion(db, fx.shopId, firstStartTemplate, fx.users.office.id);
    const pinned = await db
      .insertInto("job_procedures")
      .values({ work_order_id: fx.workOrderId, template_version_id: v1.versionId, position: 5 })
      .returning("id")
      .executeTakeFirstOrThrow();
    const edited = structuredClone(firstStartTemplate);
    edited.stages[0].steps[0].title = "Prime the oil system (edited)";
    const v2 = await createTemplateVersion(db, fx.shopId, edited, fx.users.office.id);
    expect(v2.version).toBe(2);
    const still = await db.selectFrom("job_procedures").select("template_version_id").where("id", "=", pinned.id).executeTakeFirstOrThrow();
    expect(still.template_version_id).toBe(v1.versionId);
    expect((await loadTemplateDocument(db, fx.shopId, "first-start-run-in", 1))!.stages[0].steps[0].title).toBe("Prime the oil system");
    expect((await loadTemplateDocument(db, fx.shopId, "first-start-run-in"))!.stages[0].steps[0].title).toBe(
      "Prime the oil system (edited)",
    );
    const list = await templatesWithVersions(db, fx.shopId);
    expect(list.find((t) => t.key === "first-start-run-in")!.versions.map((v) => v.version)).toEqual([2, 1]);
  });

  it("names the path and the problem for a bad file", () => {
    // eslint-disable-next-line @typescript-eslint/no-explicit-any -- a deliberately broken document
    const bad = structuredClone(turboKitTemplate) as Record<string, any>;
    bad.stages[1].steps[0].torque[0].unit = "ft-lb";
    bad.stages[0].steps[1].measurements[0].min = 2000;
    const r = readTemplateFile(JSON.stringify(bad));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues).toContainEqual({ path: "stages[1].steps[0].torque[0].unit", message: expect.stringContaining("N·m") });
    expect(r.issues).toContainEqual({ path: "stages[0].steps[1].measurements[0].min", message: "min must not exceed max" });
  });

  it("refuses text that is not JSON, or not our format, with a reason", () => {
    expect(readTemplateFile("{ not json")).toMatchObject({
      ok: false,
      issues: [{ path: "(file)", message: expect.stringMatching(/^not valid JSON/) }],
    });
    expect(readTemplateFile(JSON.stringify({ format: "something-else" }))).toEqual({
      ok: false,
      issues: [{ path: "format", message: 'expected "benchtag-template" or "benchtag-template-bundle"' }],
    });
  });

  it("imports a bundle all or nothing: one bad template leaves nothing written", async () => {
    const fx = await createShopFixture(db);
    const before = [await count("procedure_templates"), await count("template_versions"), await count("template_steps")];
    // eslint-disable-next-line @typescript-eslint/no-explicit-any -- a deliberately broken document
    const broken = structuredClone(firstStartTemplate) as Record<string, any>;
    broken.stages[1].steps[1].timer.blocksStepKey = "no-such-step";
    const bundle = { format: "benchtag-template-bundle", formatVersion: 1, templates: [turboKitTemplate, broken] };
    const r = readTemplateFile(JSON.stringify(bundle));
    expect(r).toEqual({
      ok: false,
      issues: [{ path: "templates[1].stages[1].steps[1].timer.blocksStepKey", message: 'timer blocks unknown step "no-such-step"' }],
    });
    expect([await count("procedure_templates"), await count("template_versions"), await count("template_steps")]).toEqual(before);

    // a failure half-way (the second refused after the first was written in the transaction) writes nothing:
    const good = readTemplateFile(JSON.stringify({ ...bundle, templates: [turboKitTemplate, firstStartTemplate] }));
    expect(good.ok).toBe(true);
    if (!good.ok) return;
    const sabotaged = [
      good.documents[0],
      {
        ...good.documents[1],
        stages: [
          {
            ...good.documents[1].stages[0],
            steps: [
              {
                ...good.documents[1].stages[0].steps[0],
                torque: [
                  {
                    ...turboKitTemplate.stages[1].steps[0].torque![0],
                    passes: [],
                    anglePasses: [],
                    lubricant: "",
                    torqueToYield: false,
                    boltCount: 99,
                  },
                ],
              },
            ],
          },
        ],
      },
    ];
    await expect(importTemplateDocuments(db, fx.shopId, fx.users.office.id, sabotaged as typeof good.documents)).rejects.toThrow();
    expect([await count("procedure_templates"), await count("template_versions"), await count("template_steps")]).toEqual(before);

    const written = await importTemplateDocuments(db, fx.shopId, fx.users.office.id, good.documents);
    expect(written.map((w) => [w.key, w.version])).toEqual([
      ["turbo-kit-intercooler", 1],
      ["first-start-run-in", 1],
    ]);
  });

  it("ships four valid demo templates, each marked example-only, with cautions", () => {
    expect(DEMO_TEMPLATES.map((t) => t.key)).toEqual([
      "bottom-end-assembly",
      "cylinder-head-installation",
      "turbo-kit-intercooler",
      "first-start-run-in",
    ]);
    for (const t of DEMO_TEMPLATES) {
      const doc = templateDocumentSchema.parse(t);
      expect(doc.exampleOnly).toBe(true);
      expect(doc.stages.flatMap((s) => s.steps).some((s) => s.cautions.length > 0)).toBe(true);
    }
    const turboText = JSON.stringify(turboKitTemplate);
    for (const kind of ["boost", "fuel", "hot", "lifting"]) expect(turboText).toContain(`"kind":"${kind}"`);
    expect(turboText).toMatch(/ten times the engine's displacement/);
    const runIn = templateDocumentSchema.parse(firstStartTemplate).stages.flatMap((s) => s.steps);
    expect(runIn.filter((s) => s.timer && s.key.startsWith("heat-cycle"))).toHaveLength(2);
  });
});
