import { randomUUID } from "node:crypto";
import { PDFParse } from "pdf-parse";
import { describe, expect, it } from "vitest";
import { renderHandoverReportPdf } from "@/app/_server/handover-report";
import { getJobSnapshot } from "@/db/bench/jobs";
import { addPartFitted } from "@/db/office/parts";
import { partsOfWorkOrder } from "@/db/records/parts-fitted";
import { mergeBatch } from "@/db/sync/merge";
import { changesSince } from "@/db/sync/changes";
import { loadSignOffReview } from "@/db/review/detail";
import type { SessionUser } from "@/lib/auth/session-user";
import type { OperationOf } from "@/lib/sync/operations";
import { Tablet } from "../bench/sync-ops";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// Parts fitted recorded at the bench (`part.fitted`), merged into real PostgreSQL.

const db = useTestDb();
const asUser = (u: ShopFixture["users"]["mechanic"]): SessionUser => ({ ...u, customerId: null });

async function setup() {
  const fx = await createShopFixture(db);
  const mech = asUser(fx.users.mechanic);
  const stepId = fx.stepByKey["rod-bolts"].id;
  return { fx, mech, stepId, tablet: new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId) };
}

type PartPayload = OperationOf<"part.fitted">["payload"];
const piston = (stepId: string, over: Partial<PartPayload> = {}): PartPayload => ({
  partFittedId: randomUUID(),
  stepId,
  partNumber: "GS-PST-7600",
  description: "Forged piston, 76.00 mm",
  serial: "GS-0042",
  quantity: 1,
  supplier: "Harbour Pistons",
  ...over,
});

const partRows = (workOrderId: string) =>
  // (ops made in one test often share a millisecond: sorted by what they hold)
  db.selectFrom("parts_fitted").selectAll().where("work_order_id", "=", workOrderId).orderBy("part_number").orderBy("serial").execute();
const auditOf = (ids: string[]) =>
  db
    .selectFrom("audit_log")
    .select(["entity_id", "action", "outcome", "reason", "actor_id", "work_order_id"])
    .where("entity_id", "in", ids)
    .orderBy("id")
    .execute();

describe("part.fitted merged into PostgreSQL", () => {
  it("stores one row with the tablet's id, the step, the fitter and the fitting time, and audits it", async () => {
    const { fx, mech, stepId, tablet } = await setup();
    const payload = piston(stepId);
    const op = tablet.make("part.fitted", payload);
    const { supplier: _s, ...noSupplier } = piston(stepId, {
      serial: undefined,
      batch: "L24-118",
      quantity: 8,
      partNumber: "GS-RB-8",
      description: "Rod bolt",
    });
    const bolts = tablet.make("part.fitted", noSupplier);
    const res = await mergeBatch(db, mech, tablet.batch([op, bolts]));
    expect(res).toMatchObject({ accepted: [op.id, bolts.id], refused: [], flagged: [], duplicates: [] });

    const rows = await partRows(fx.workOrderId);
    expect(rows.map((r) => ({ ...r, fitted_at: (r.fitted_at as unknown as Date).toISOString() }))).toEqual([
      {
        id: payload.partFittedId,
        shop_id: fx.shopId,
        work_order_id: fx.workOrderId,
        step_id: stepId,
        part_number: "GS-PST-7600",
        description: "Forged piston, 76.00 mm",
        supplier: "Harbour Pistons",
        serial: "GS-0042",
        batch: null,
        quantity: 1,
        fitted_by: mech.id,
        fitted_at: op.deviceTime,
        operation_id: op.id,
      },
      expect.objectContaining({
        id: noSupplier.partFittedId,
        supplier: "",
        serial: null,
        batch: "L24-118",
        quantity: 8,
        operation_id: bolts.id,
      }),
    ]);
    expect(await auditOf([op.id, bolts.id])).toEqual([
      { entity_id: op.id, action: "sync.part.fitted", outcome: "accepted", reason: null, actor_id: mech.id, work_order_id: fx.workOrderId },
      {
        entity_id: bolts.id,
        action: "sync.part.fitted",
        outcome: "accepted",
        reason: null,
        actor_id: mech.id,
        work_order_id: fx.workOrderId,
      },
    ]);
  });

  it("stores an operation sent twice, or resent in a later batch, exactly once", async () => {
    const { fx, mech, stepId, tablet } = await setup();
    const op = tablet.make("part.fitted", piston(stepId));
    const same = tablet.batch([op, op]);
    expect((await mergeBatch(db, mech, same)).accepted).toEqual([op.id]);
    const again = await mergeBatch(db, mech, same);
    expect(again).toMatchObject({ accepted: [], duplicates: [op.id], refused: [] });
    const later = tablet.make("part.fitted", piston(stepId, { serial: "GS-0043" }));
    expect(await mergeBatch(db, mech, tablet.batch([op, later]))).toMatchObject({ accepted: [later.id], duplicates: [op.id] });

    expect((await partRows(fx.workOrderId)).map((r) => r.serial)).toEqual(["GS-0042", "GS-0043"]);
    expect(await auditOf([op.id])).toHaveLength(1);
    const ops = await db.selectFrom("operations").select("id").where("id", "=", op.id).execute();
    expect(ops).toHaveLength(1);
  });

  it("keeps a mechanic's part on another mechanic's job flagged; refuses an office user, auditing the refusal", async () => {
    const { fx, stepId } = await setup();
    const mech2 = asUser(fx.users.mechanic2);
    const t2 = new Tablet("bay-2", mech2.id, fx.workOrderId);
    const op = t2.make("part.fitted", piston(stepId));
    expect((await mergeBatch(db, mech2, t2.batch([op]))).flagged).toEqual([
      {
        id: op.id,
        reason: `Work order #1 is assigned to ${fx.users.mechanic.name}, not to the mechanic who recorded this; kept for the supervisor to check.`,
      },
    ]);

    const office = asUser(fx.users.office);
    const t3 = new Tablet("office-pc", office.id, fx.workOrderId);
    const op3 = t3.make("part.fitted", piston(stepId));
    expect((await mergeBatch(db, office, t3.batch([op3]))).refused).toEqual([
      { id: op3.id, reason: "Your role (office) may not record bench work." },
    ]);

    expect((await partRows(fx.workOrderId)).map((r) => r.serial)).toEqual(["GS-0042"]);
    expect((await auditOf([op.id, op3.id])).map((a) => [a.entity_id, a.action, a.outcome])).toEqual([
      [op.id, "sync.part.fitted", "accepted"],
      [op3.id, "sync.part.fitted", "refused"],
    ]);
  });

  it("refuses a step from another job and a part record id already used", async () => {
    const { fx, mech, stepId, tablet } = await setup();
    const other = await createShopFixture(db);
    const stranger = tablet.make("part.fitted", piston(other.stepByKey["rod-bolts"].id));
    const first = tablet.make("part.fitted", piston(stepId));
    const reuse = tablet.make("part.fitted", piston(stepId, { partFittedId: first.payload.partFittedId, serial: "GS-0077" }));
    const res = await mergeBatch(db, mech, tablet.batch([stranger, first, reuse]));
    expect(res.accepted).toEqual([first.id]);
    expect(res.refused).toEqual([
      {
        id: stranger.id,
        reason: `Step ${other.stepByKey["rod-bolts"].id} is not part of a procedure on work order #1. Discard this entry with a reason; record the work again on the job as it is now.`,
      },
      {
        id: reuse.id,
        reason: `Part record ${first.payload.partFittedId} is already on record. Discard this entry with a reason; record the work again on the job as it is now.`,
      },
    ]);
    expect((await partRows(fx.workOrderId)).map((r) => r.serial)).toEqual(["GS-0042"]);
  });

  it("keeps a serial recorded twice on the job — by two tablets, or after the office — and flags it", async () => {
    const { fx, mech, stepId, tablet } = await setup();
    await addPartFitted(db, fx.shopId, fx.users.office.id, fx.workOrderId, {
      partNumber: "GS-ROD-130",
      description: "H-beam rod",
      serial: "GR-7",
      batch: null,
      quantity: 1,
      stepId: null,
    });
    expect((await mergeBatch(db, mech, tablet.batch([tablet.make("part.fitted", piston(stepId))]))).flagged).toEqual([]);

    const sup = asUser(fx.users.supervisor);
    const t2 = new Tablet("bay-sup", sup.id, fx.workOrderId);
    const twice = t2.make("part.fitted", piston(fx.stepByKey["case-bolts"].id, { serial: "gs 0042" }));
    const afterOffice = t2.make("part.fitted", piston(stepId, { partNumber: "gs-rod-130", description: "H-beam rod", serial: "GR-7" }));
    const res = await mergeBatch(db, sup, t2.batch([twice, afterOffice]));
    expect(res.accepted).toEqual([twice.id, afterOffice.id]);
    expect(res.flagged).toEqual([
      {
        id: twice.id,
        reason:
          'Serial number gs 0042 of part GS-PST-7600 is already recorded on work order #1 at step "Torque connecting-rod bolts": check the part was not recorded twice or fitted twice.',
      },
      {
        id: afterOffice.id,
        reason:
          "Serial number GR-7 of part gs-rod-130 is already recorded on work order #1: check the part was not recorded twice or fitted twice.",
      },
    ]);
    expect(await partRows(fx.workOrderId)).toHaveLength(4);
    const [audit] = await auditOf([twice.id]);
    expect(audit).toMatchObject({ outcome: "accepted", reason: res.flagged[0].reason });
  });

  it("keeps bench-recorded parts append-only", async () => {
    const { fx, mech, stepId, tablet } = await setup();
    const payload = piston(stepId);
    await mergeBatch(db, mech, tablet.batch([tablet.make("part.fitted", payload)]));
    await expect(
      db.updateTable("parts_fitted").set({ serial: "GS-9999" }).where("id", "=", payload.partFittedId).execute(),
    ).rejects.toThrow(/parts_fitted is append-only: UPDATE refused/);
    await expect(db.deleteFrom("parts_fitted").where("id", "=", payload.partFittedId).execute()).rejects.toThrow(
      /append-only: DELETE refused/,
    );
    expect((await partRows(fx.workOrderId))[0].serial).toBe("GS-0042");
  });
});

describe("bench-recorded parts read back", () => {
  it("appear in the job snapshot with fitter and flag, and in other tablets' changes", async () => {
    const { fx, mech, stepId, tablet } = await setup();
    const first = tablet.make("part.fitted", piston(stepId));
    const repeat = tablet.make("part.fitted", piston(stepId));
    await mergeBatch(db, mech, tablet.batch([first, repeat]));

    const snap = (await getJobSnapshot(db, mech, fx.workOrderId))!;
    expect(snap.state.parts).toEqual([
      {
        id: first.payload.partFittedId,
        stepId,
        partNumber: "GS-PST-7600",
        description: "Forged piston, 76.00 mm",
        supplier: "Harbour Pistons",
        serial: "GS-0042",
        batch: null,
        quantity: 1,
        fittedBy: mech.id,
        fittedAt: first.deviceTime,
        flagged: false,
        flagReason: null,
        operationId: first.id,
      },
      expect.objectContaining({
        id: repeat.payload.partFittedId,
        flagged: true,
        flagReason: expect.stringContaining("already recorded on work order #1"),
      }),
    ]);

    const feed = await changesSince(db, fx.shopId, { deviceId: "another-tablet", authorId: mech.id }, null);
    // another tablet is told both entries changed the job (their flags come with the job's fresh copy, above)
    const named = feed.changes.flatMap((c) => (c.type === "operation" ? [c.id] : []));
    expect(named.filter((id) => id === first.id || id === repeat.id)).toEqual([first.id, repeat.id]);
    expect(feed.changes.every((c) => c.workOrderId === fx.workOrderId)).toBe(true);
    expect((await changesSince(db, fx.shopId, { deviceId: tablet.deviceId, authorId: mech.id }, null)).changes).toEqual([]);
  });

  it("show on the supervisor's review of the signed-off stage, a repeated serial with its flag", async () => {
    const { fx, mech, stepId, tablet } = await setup();
    const first = tablet.make("part.fitted", piston(stepId));
    const repeat = tablet.make("part.fitted", piston(stepId, { serial: "GS 0042" }));
    const signOff = tablet.make("stage.signed-off", { jobProcedureId: fx.procedures[0].id, stageKey: "assemble" });
    await mergeBatch(db, mech, tablet.batch([first, repeat, signOff]));

    const review = (await loadSignOffReview(db, asUser(fx.users.supervisor), signOff.id))!;
    const step = review.steps.find((s) => s.id === stepId)!;
    expect(step.parts.map((p) => [p.id, p.serial, p.by?.name, p.flagReason])).toEqual([
      [first.payload.partFittedId, "GS-0042", mech.name, null],
      [
        repeat.payload.partFittedId,
        "GS 0042",
        mech.name,
        expect.stringContaining("Serial number GS 0042 of part GS-PST-7600 is already recorded"),
      ],
    ]);
    expect(review.steps.filter((s) => s.id !== stepId).flatMap((s) => s.parts)).toEqual([]);
  });

  it("show on the office's list and the handover report with the step and who fitted them", async () => {
    const { fx, mech, stepId, tablet } = await setup();
    const op = tablet.make("part.fitted", piston(stepId));
    await mergeBatch(db, mech, tablet.batch([op]));
    await addPartFitted(db, fx.shopId, fx.users.office.id, fx.workOrderId, {
      partNumber: "GS-HG-1",
      description: "Head gasket",
      serial: null,
      batch: "HG-24",
      quantity: 1,
      stepId: null,
    });

    const list = await partsOfWorkOrder(db, fx.shopId, fx.workOrderId);
    expect(list.map(({ id: _id, fittedAt: _at, ...p }) => p)).toEqual([
      {
        partNumber: "GS-PST-7600",
        description: "Forged piston, 76.00 mm",
        supplier: "Harbour Pistons",
        serial: "GS-0042",
        batch: null,
        quantity: 1,
        stepTitle: "Torque connecting-rod bolts",
        fittedByName: mech.name,
        flagReason: null,
        atBench: true,
        withdrawn: null,
      },
      {
        partNumber: "GS-HG-1",
        description: "Head gasket",
        supplier: "",
        serial: null,
        batch: "HG-24",
        quantity: 1,
        stepTitle: null,
        fittedByName: fx.users.office.name,
        flagReason: null,
        atBench: false,
        withdrawn: null,
      },
    ]);
    expect(await partsOfWorkOrder(db, randomUUID(), fx.workOrderId)).toEqual([]);

    const parser = new PDFParse({ data: new Uint8Array(await renderHandoverReportPdf(db, fx.shopId, fx.workOrderId)) });
    // Compared without white space: table cells wrap.
    const text = (await parser.getText()).text.replace(/\s+/g, "");
    await parser.destroy();
    const squeeze = (t: string) => t.replace(/\s+/g, "");
    expect(text).toContain(squeeze("Fitted at, by"));
    expect(text).toContain("GS-0042");
    expect(text).toContain(squeeze(`Torque connecting-rod bolts, ${mech.name}`));
    expect(text).toContain(squeeze(`no step named, recorded by ${fx.users.office.name}`));
  });
});
