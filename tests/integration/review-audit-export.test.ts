import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { auditCsvResponse } from "@/app/_server/audit-csv-response";
import { appendAudit } from "@/db/audit/append";
import { pageAuditLog } from "@/db/audit/read";
import { decideOnSignOff } from "@/db/review/decide";
import { mergeBatch } from "@/db/sync/merge";
import { AUDIT_CSV_COLUMNS } from "@/lib/review/audit-csv";
import { auditExportSchema, isoDay } from "@/lib/review/audit-range";
import { decisionInputSchema } from "@/lib/review/decision-input";
import { auditFilterSchema, auditQuerySchema } from "@/lib/review/list-queries";
import { Tablet } from "../bench/sync-ops";
import { measureStageWork, reviewSetup, sync } from "./support/review-bench";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

async function csvOf(shopId: string, filter: Record<string, string>) {
  // From and To left out: the last 30 days up to today, which holds every entry written by the test.
  const res = auditCsvResponse(db, shopId, auditExportSchema(() => new Date()).parse(filter));
  const text = await res.text();
  return { res, text, parsed: Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true }) };
}

describe("audit log: who did what, when, from which device, accepted or refused and why", () => {
  it("lists a job's trail on the page and exports it as CSV with the documented columns", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const tablet = new Tablet("bay-7", users.mech.id, fx.workOrderId);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage, { "top-ring-gap:0": 0.5 });
    await sync(db, users.mech, tablet, ops);
    // A refused operation: the customer's job of another shop is not this mechanic's to touch.
    const other = await reviewSetup(db);
    const stray = tablet.complete(other.stepIds[0], { workOrderId: other.fx.workOrderId });
    const refused = await mergeBatch(db, users.mech, tablet.batch([stray]));
    expect(refused.refused).toHaveLength(1);
    const reason = '=HYPERLINK("x") ring gap, cylinder 1 — regap';
    await decideOnSignOff(db, users.sup, signOff.id, decisionInputSchema.parse({ decision: "approved", expectedDecisionId: null }));
    await decideOnSignOff(
      db,
      users.sup,
      signOff.id,
      decisionInputSchema.parse({ decision: "sent_back", expectedDecisionId: null, reason, reopenStepIds: [stepIds[2]] }),
    );

    const page = await pageAuditLog(db, fx.shopId, auditQuerySchema.parse({ job: "1", size: "100" }));
    expect(page.total).toBe(ops.length + 2);
    expect(page.rows[0]).toMatchObject({
      action: "review.send-back",
      outcome: "accepted",
      actorName: users.sup.name,
      workOrderNumber: 1,
      reason,
    });
    expect(page.rows[1]).toMatchObject({
      action: "review.approve",
      outcome: "refused",
      reason: expect.stringMatching(/Top ring gap, Cyl 1: 0\.5 mm/),
    });
    const refusedPage = await pageAuditLog(db, fx.shopId, auditQuerySchema.parse({ outcome: "refused" }));
    expect(refusedPage.rows.map((r) => r.action).sort()).toEqual(["review.approve", "sync.step.completed"]);
    expect(refusedPage.rows.find((r) => r.action === "sync.step.completed")).toMatchObject({
      deviceId: "bay-7",
      workOrderNumber: null,
      reason: expect.stringMatching(/not in your shop/),
    });
    const byAction = await pageAuditLog(db, fx.shopId, auditQuerySchema.parse({ action: "sync.measurement" }));
    expect(byAction.total).toBe(ops.filter((o) => o.kind === "measurement.recorded").length);
    // The other shop sees none of it.
    expect((await pageAuditLog(db, other.fx.shopId, auditQuerySchema.parse({}))).total).toBe(0);

    const { res, text, parsed } = await csvOf(fx.shopId, { job: "1" });
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(res.headers.get("content-disposition")).toMatch(
      /^attachment; filename="audit-log-job-1-\d{4}-\d\d-\d\d-to-\d{4}-\d\d-\d\d\.csv"$/,
    );
    expect(res.headers.get("content-disposition")).toContain(`-to-${isoDay(new Date())}.csv`);
    expect(text.split("\r\n")[0]).toBe(AUDIT_CSV_COLUMNS.join(","));
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toHaveLength(ops.length + 2);
    // Oldest first: the tablet's operations in stamp order, then the two decisions.
    expect(parsed.data.slice(0, ops.length).map((r) => r.entity_id)).toEqual(ops.map((o) => o.id));
    expect(parsed.data[0]).toMatchObject({
      work_order: "1",
      actor_email: users.mech.email,
      actor_role: "mechanic",
      device: "bay-7",
      action: "sync.measurement.recorded",
      outcome: "accepted",
    });
    const [approve, sendBack] = parsed.data.slice(-2);
    expect(approve).toMatchObject({
      action: "review.approve",
      outcome: "refused",
      entity: "sign_off",
      entity_id: signOff.id,
      actor_name: users.sup.name,
    });
    // A reason that a spreadsheet would run as a formula is written neutralised, the rest as typed.
    expect(sendBack).toMatchObject({ action: "review.send-back", outcome: "accepted", reason: `'${reason}` });
    expect(JSON.parse(sendBack.detail_json)).toMatchObject({ reopenedStepIds: [stepIds[2]], reopenedSteps: ["Top ring end gap"] });
    expect(new Date(sendBack.logged_at).toISOString()).toBe(sendBack.logged_at);
  });

  it("exports more rows than one read holds, in order, and just the header when nothing matches", async () => {
    const { fx, users } = await reviewSetup(db);
    const entries = Array.from({ length: 1203 }, (_, i) => ({
      shopId: fx.shopId,
      actorId: users.office.id,
      action: "test.bulk",
      entity: "work_order",
      entityId: String(i),
      workOrderId: fx.workOrderId,
      outcome: "accepted" as const,
      detail: { i, note: 'comma, "quote" and\nnew line' },
    }));
    await appendAudit(db, entries.slice(0, 600));
    await appendAudit(db, entries.slice(600));
    const { parsed } = await csvOf(fx.shopId, { action: "test.bulk" });
    expect(parsed.data).toHaveLength(1203);
    expect(parsed.data.map((r) => Number(r.entity_id))).toEqual(entries.map((_, i) => i));
    expect(JSON.parse(parsed.data[1202].detail_json)).toEqual({ i: 1202, note: 'comma, "quote" and\nnew line' });

    const none = await csvOf(fx.shopId, { job: "999" });
    expect(none.text).toBe(`${AUDIT_CSV_COLUMNS.join(",")}\r\n`);
    expect(auditFilterSchema.safeParse({ outcome: "maybe" }).error?.issues[0].message).toBe("The outcome must be accepted or refused");
  });
});
