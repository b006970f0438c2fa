import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { renderBuildReport } from "@/app/_server/handover-report";
import { GET as getSheet, POST as postSheet } from "@/app/api/jobs/[id]/build-sheet/route";
import { buildFiguresForSignOff, buildReadingsOf } from "@/db/records/build-sheets";
import { createTemplateVersion } from "@/db/templates/versions";
import type { TemplateDocumentInput } from "@/lib/procedures/template-schema";
import { Tablet } from "../bench/sync-ops";
import { pdfText } from "./support/pdf-text";
import { asUser, sync } from "./support/review-bench";
import { appRequest } from "./support/route-calls";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

// An invented head-and-block measuring stage whose spec keys name the build figures (README "Build figures").
const MEASURE: TemplateDocumentInput = {
  format: "benchtag-template",
  formatVersion: 1,
  key: "compression-check",
  name: "Compression check",
  stages: [
    {
      key: "measure",
      title: "Measure for compression",
      steps: [
        {
          key: "cc-and-deck",
          title: "Bore, stroke, chamber, deck and gasket",
          measurements: [
            { key: "bore-1", label: "Bore, cyl 1", min: 85.9, max: 86.1, unit: "mm", readingLabels: ["Thrust", "Pin"] },
            { key: "stroke", label: "Stroke", min: 85.9, max: 86.1, unit: "mm" },
            { key: "chamber-volume", label: "Chamber volume", min: 44, max: 46, unit: "cc" },
            { key: "deck-clearance", label: "Piston to deck", min: 0, max: 0.3, unit: "mm" },
            { key: "gasket-thickness", label: "Compressed gasket", min: 1, max: 1.2, unit: "mm" },
          ],
        },
      ],
    },
  ],
};

async function measuredJob() {
  const fx = await createShopFixture(db);
  const { versionId } = await createTemplateVersion(db, fx.shopId, MEASURE, fx.users.office.id);
  const jp = await db
    .insertInto("job_procedures")
    .values({ work_order_id: fx.workOrderId, template_version_id: versionId, position: 5 })
    .returning("id")
    .executeTakeFirstOrThrow();
  const step = await db.selectFrom("template_steps").select("id").where("template_version_id", "=", versionId).executeTakeFirstOrThrow();
  const specs = Object.fromEntries(
    (await db.selectFrom("measurement_specs").select(["id", "key"]).where("step_id", "=", step.id).execute()).map((s) => [s.key, s.id]),
  );
  const mech = asUser(fx.users.mechanic);
  const tablet = new Tablet(`tablet-${randomUUID().slice(0, 8)}`, mech.id, fx.workOrderId);
  // REFERENCE-CHECKS "Static CR" worked example (Heywood ch. 2, calc): 86 × 86, 45 cc, 87 × 1.1 gasket,
  // 0.2 deck, 5 cc dish → 9.6577. Bore read twice (85.998, 86.002: mean 86).
  const signOff = tablet.make("stage.signed-off", { jobProcedureId: jp.id, stageKey: "measure" });
  const r = await sync(db, mech, tablet, [
    tablet.read(step.id, specs["bore-1"], 0, 85.998),
    tablet.read(step.id, specs["bore-1"], 1, 86.002),
    tablet.read(step.id, specs.stroke, 0, 86),
    tablet.read(step.id, specs["chamber-volume"], 0, 45, { unit: "cc" }),
    tablet.read(step.id, specs["deck-clearance"], 0, 0.2),
    tablet.read(step.id, specs["gasket-thickness"], 0, 1.1),
    tablet.complete(step.id),
    signOff,
  ]);
  expect(r.refused).toEqual([]);
  return { fx, stage: { jobProcedureId: jp.id, stageKey: "measure" }, signOffId: signOff.id };
}

const post = (workOrderId: string, user: ReturnType<typeof asUser>, body: unknown) =>
  postSheet.handle(
    appRequest(`/api/jobs/${workOrderId}/build-sheet`, {
      method: "POST",
      body: JSON.stringify(body),
      headers: { "content-type": "application/json" },
    }),
    { user, db, params: { id: workOrderId } },
  );

describe("the build's own figures from its readings (real PostgreSQL, readings through the sync merge)", () => {
  it("the build sheet route refuses bad figures in workshop words and keeps nothing; a good sheet is kept append-only", async () => {
    const { fx } = await measuredJob();
    const office = asUser(fx.users.office);
    const bad = await post(fx.workOrderId, office, {
      figures: { pistonDishCc: "five", rodLengthMm: 1e308 },
      mapOutline: { flowUnit: "lb/min", surgeLine: [], chokeLine: [] },
    });
    expect(bad.status).toBe(400);
    const body = (await bad.json()) as { issues: Array<{ path: string; message: string }> };
    const byPath = Object.fromEntries(body.issues.map((i) => [i.path, i.message]));
    expect(byPath["figures.pistonDishCc"]).toBe(
      'Piston dish must be between -100 and 200 cc (positive for a dish or valve reliefs, negative for a dome); got "five" (text, not a number).',
    );
    expect(byPath["figures.rodLengthMm"]).toMatch(/^Rod length \(centre to centre\) must be between 20 and 600 mm; got /);
    expect(byPath["mapOutline.surgeLine"]).toMatch(/^Surge line must have from 2 to 50 points/);
    expect(await db.selectFrom("build_sheets").select("id").where("work_order_id", "=", fx.workOrderId).execute()).toEqual([]);

    for (const target of [9.8, 9.5]) {
      const ok = await post(fx.workOrderId, office, {
        figures: { targetCompressionRatio: target, gasketBoreMm: 87, pistonDishCc: 5, boostKpa: 68.9 },
      });
      expect(ok.status).toBe(201);
    }
    expect(await db.selectFrom("build_sheets").select("id").where("work_order_id", "=", fx.workOrderId).execute()).toHaveLength(2);
    const got = await getSheet.handle(appRequest(`/api/jobs/${fx.workOrderId}/build-sheet`), {
      user: office,
      db,
      params: { id: fx.workOrderId },
    });
    const numbers = (await got.json()) as {
      sheet: { figures: Record<string, number> };
      figures: { compressionRatio: number; targetCompressionRatio: number };
    };
    expect(numbers.sheet.figures.targetCompressionRatio).toBe(9.5); // the newest is current
    expect(numbers.figures.compressionRatio).toBeCloseTo(9.6577, 4);
    // every save is in the audit log
    const audited = await db
      .selectFrom("audit_log")
      .select(["outcome"])
      .where("action", "=", "build-sheet.saved")
      .where("work_order_id", "=", fx.workOrderId)
      .execute();
    expect(audited.map((a) => a.outcome)).toEqual(["accepted", "accepted"]);
    // a handed-over job's record is closed: its build sheet is refused, with the reason on record
    const closed = await createShopFixture(db, { status: "handed_over" });
    const late = await post(closed.workOrderId, asUser(closed.users.office), { figures: { targetCompressionRatio: 9 } });
    expect(late.status).toBe(409);
    expect(((await late.json()) as { error: string }).error).toMatch(
      /its record is closed\. A change to the build sheet for a bike that has left belongs on a new work order/,
    );
    expect(await db.selectFrom("build_sheets").select("id").where("work_order_id", "=", closed.workOrderId).execute()).toEqual([]);
    // another shop's user gets nothing
    const other = await createShopFixture(db);
    const refused = await post(fx.workOrderId, asUser(other.users.office), { figures: { targetCompressionRatio: 9 } });
    expect(refused.status).toBe(404);
  });

  it("the handover report's rows and PDF carry the actual compression and boosted figures beside the targets", async () => {
    const { fx, stage, signOffId } = await measuredJob();
    expect(
      await post(fx.workOrderId, asUser(fx.users.office), {
        figures: { targetCompressionRatio: 9.5, gasketBoreMm: 87, pistonDishCc: 5, boostKpa: 68.9476 },
      }),
    ).toHaveProperty("status", 201);
    // the stage's own readings are the ones the review page reads
    expect((await buildReadingsOf(db, fx.workOrderId, stage)).map((r) => r.specKey).sort()).toEqual([
      "bore-1",
      "bore-1",
      "chamber-volume",
      "deck-clearance",
      "gasket-thickness",
      "stroke",
    ]);

    // the supervisor's review of the measuring stage shows the same figures; another shop's sign-off gives nothing
    const inReview = await buildFiguresForSignOff(db, fx.shopId, signOffId);
    expect(inReview?.compressionRatio).toBeCloseTo(9.6577, 4);
    expect(inReview?.targetCompressionRatio).toBe(9.5);
    expect(await buildFiguresForSignOff(db, (await createShopFixture(db)).shopId, signOffId)).toBeNull();

    const { pdf, lines } = await renderBuildReport(db, fx.shopId, fx.workOrderId);
    // 9.6577 static; boosted rule of thumb 9.6577 × (101.325 + 68.9476) / 101.325 = 16.229 (common practice); target 9.5 → 15.964
    expect(lines).toContain("Build figures: Compression ratio (from the readings) · 9.66:1 · target 9.50:1");
    expect(lines).toContain("Build figures: Boosted compression ratio at 68.9 kPa boost (rule of thumb) · 16.23:1 · target 15.96:1");
    expect(lines).toContain("Build figures: Squish clearance (tightest cylinder) · 1.30 mm");
    expect(lines.some((l) => l.startsWith("Build figures: worked from Bore 86.00 mm (mean of 2 readings, 86.00–86.00)"))).toBe(true);
    expect(lines).toContain("Build figures: Dynamic compression ratio: needs rod length, intake valve closing.");
    const text = (await pdfText(pdf)).replace(/\s+/g, " ");
    expect(text).toContain("Build figures");
    expect(text).toContain("9.66:1");
    expect(text).toContain("16.23:1");
    expect(text).toContain("target 9.50:1");
  });
});
