import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { renderHandoverReportPdf } from "@/app/_server/handover-report";
import { Tablet } from "../bench/sync-ops";
import { closeOutJob } from "./support/close-out";
import { pdfText } from "./support/pdf-text";
import { sync } from "./support/review-bench";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

// The build report tells what the record says: two tablets read the same spots of the same job
// offline, the first out of spec, the second a minute later in spec. The current reading of each
// spot (sync rule 9: the latest stamp among the readings no correction replaced) is the database
// view current_measurements; every value and verdict the PDF prints is checked against that view.
describe("the build report's readings are the database view's current readings (real PostgreSQL)", () => {
  it("two tablets' overlapping readings: the report prints the later, in-spec ones and counts none out of spec", async () => {
    const job = await closeOutJob(db);
    const start = Date.now() - 120_000;
    const first = new Tablet(`tablet-a-${randomUUID().slice(0, 8)}`, job.users.mech.id, job.workOrderId, () => start);
    const second = new Tablet(`tablet-b-${randomUUID().slice(0, 8)}`, job.users.mech.id, job.workOrderId, () => start + 60_000);
    const step = job.steps["measure-gap"];
    // the second tablet syncs first: arrival order must not matter, only the stamps
    await sync(db, job.users.mech, second, [second.read(step, job.specId, 0, 0.15), second.read(step, job.specId, 1, 0.16)]);
    await sync(db, job.users.mech, first, [first.read(step, job.specId, 0, 0.25), first.read(step, job.specId, 1, 0.26)]);
    expect(await db.selectFrom("measurements").select("id").where("work_order_id", "=", job.workOrderId).execute()).toHaveLength(4);

    const view = await db
      .selectFrom("current_measurements")
      .select(["reading_index", "value", "verdict"])
      .where("work_order_id", "=", job.workOrderId)
      .orderBy("reading_index")
      .execute();
    expect(view.map((v) => [v.reading_index, Number(v.value), v.verdict])).toEqual([
      [0, 0.15, "in"],
      [1, 0.16, "in"],
    ]);

    const text = await pdfText(await renderHandoverReportPdf(db, job.fx.shopId, job.workOrderId));
    const labels = ["Left", "Right"];
    for (const v of view) {
      // one printed row per spot: which, value, limits, verdict
      expect(text).toMatch(new RegExp(`Cover gap, ${labels[v.reading_index]} ${Number(v.value)} mm 0\\.1 to 0\\.2 mm in spec`));
    }
    expect(text).toContain(`All ${view.length} current readings are within spec.`);
    expect(text).not.toContain("out of spec");
    expect(text).not.toMatch(/\b0\.2[56] mm\b/);
  });
});
