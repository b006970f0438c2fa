import { randomUUID } from "node:crypto";
import { sql } from "kysely";
import { PDFParse } from "pdf-parse";
import { describe, expect, it } from "vitest";
import { renderHandoverReportPdf } from "@/app/_server/handover-report";
import { GET as readingsCsvRoute } from "@/app/api/office/bikes/[id]/readings/route";
import { POST as syncRoute } from "@/app/api/sync/route";
import { getJobSnapshot } from "@/db/bench/jobs";
import { bikeRecord } from "@/db/records/bike-record";
import { withdrawnEntries } from "@/db/records/withdrawn-entries";
import { decideOnSignOff } from "@/db/review/decide";
import { loadSignOffReview } from "@/db/review/detail";
import { pageReviewQueue } from "@/db/review/queue";
import { queueQuerySchema } from "@/lib/review/list-queries";
import { mergeBatch } from "@/db/sync/merge";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { asUser } from "./support/review-bench";
import { createShopFixture } from "./support/shop-fixture";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

// The record's integrity across the merge, the database and every reader: two tablets on one
// bolt, holds, timers stopped or cancelled, withdrawals, and readings that keep their digits.

const db = useTestDb();

async function setup() {
  const fx = await createShopFixture(db);
  const specs = await fixtureSpecs(db, fx);
  const mech = asUser(fx.users.mechanic);
  const mech2 = asUser(fx.users.mechanic2);
  const sup = asUser(fx.users.supervisor);
  // unassigned, so both mechanics may work on it
  await db.updateTable("work_orders").set({ assigned_mechanic_id: null }).where("id", "=", fx.workOrderId).execute();
  const tablet = (u: { id: string }) => new Tablet(`tab-${randomUUID().slice(0, 6)}`, u.id, fx.workOrderId);
  return { fx, specs, mech, mech2, sup, a: tablet(mech), b: tablet(mech2), s: tablet(sup) };
}

const opRow = (id: string) => db.selectFrom("operations").select(["flagged", "flag_reason"]).where("id", "=", id).executeTakeFirstOrThrow();

async function pdfText(buf: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(buf) });
  try {
    return (await parser.getText()).text.replace(/\s+/g, " ");
  } finally {
    await parser.destroy();
  }
}

describe("two tablets on one bolt", () => {
  it("the second record of a bolt and pass is kept and flagged on the operation; louder for a torque-to-yield bolt; review shows both", async () => {
    const { fx, specs, mech, mech2, sup, a, b } = await setup();
    const caseA = a.bolt(specs.caseBoltsStepId, specs.caseBoltsSpecId, 1, 3);
    const rodA = a.bolt(specs.rodStepId, specs.rodSpecId, 3, 1);
    await mergeBatch(db, mech, a.batch([caseA, rodA]));
    const caseB = b.bolt(specs.caseBoltsStepId, specs.caseBoltsSpecId, 1, 3);
    const rodB = b.bolt(specs.rodStepId, specs.rodSpecId, 3, 1);
    const res = await mergeBatch(db, mech2, b.batch([caseB, rodB]));
    expect(res.accepted.sort()).toEqual([caseB.id, rodB.id].sort());
    expect(res.flagged.map((f) => f.id).sort()).toEqual([caseB.id, rodB.id].sort());

    expect(await opRow(caseA.id)).toEqual({ flagged: false, flag_reason: null });
    expect(await opRow(caseB.id)).toMatchObject({
      flagged: true,
      flag_reason: expect.stringMatching(
        new RegExp(`^Bolt 3, pass 1 of “Main case bolts M9” was already recorded \\(tablet ${a.deviceId}, `),
      ),
    });
    expect((await opRow(rodB.id)).flag_reason).toMatch(/^TORQUE-TO-YIELD BOLT RECORDED TWICE: Bolt 1, pass 3 of “Rod cap bolts, rod 1”/);
    const kept = await db.selectFrom("torque_records").select("id").where("id", "in", [caseA.id, caseB.id, rodA.id, rodB.id]).execute();
    expect(kept).toHaveLength(4);

    const snap = (await getJobSnapshot(db, mech, fx.workOrderId))!;
    expect(snap.state.torqueRecords.find((t) => t.id === rodB.id)).toMatchObject({ flagged: true });

    const signOff = a.make("stage.signed-off", { jobProcedureId: fx.procedures[0].id, stageKey: "assemble" });
    await mergeBatch(db, mech, a.batch([signOff]));
    const review = (await loadSignOffReview(db, sup, signOff.id))!;
    expect(review.stretchBoltsTwice).toMatchObject([
      { specLabel: "Rod cap bolts, rod 1", passIndex: 3, bolt: 1, records: [{ by: { id: mech.id } }, { by: { id: mech2.id } }] },
    ]);
    const caseSpec = review.steps.flatMap((s) => s.torque).find((t) => t.id === specs.caseBoltsSpecId)!;
    expect(caseSpec.repeated).toMatchObject([{ passIndex: 1, bolt: 3 }]);
  });
});

describe("holds hold on the server", () => {
  const cure = (t: Tablet, specs: Awaited<ReturnType<typeof fixtureSpecs>>, startedAt: number, timerId = randomUUID()) =>
    t.make("timer.started", {
      timerId,
      stepId: specs.cureStepId,
      timerSpecId: specs.cureTimerSpecId,
      label: "Sealant cure before oil and cranking",
      durationS: 1800,
      startedAt: new Date(startedAt).toISOString(),
    });

  it("a cure stopped early, or cancelled, that arrives after work on the held step was accepted is flagged, naming that work", async () => {
    for (const how of ["stopped", "cancelled"] as const) {
      const { specs, mech, mech2, a, b } = await setup();
      const now = Date.now();
      const started = cure(a, specs, now - 50 * 60_000);
      await mergeBatch(db, mech, a.batch([started]));
      // tablet B, online: the server thinks the cure ran its 30 minutes, so the oil fill is accepted
      const fill = b.complete(specs.oilPrimeStepId);
      const r = await mergeBatch(db, mech2, b.batch([fill]));
      expect(r.accepted).toEqual([fill.id]);
      expect(r.flagged).toEqual([]);
      // tablet A was offline: it had stopped (or cancelled) the cure 5 minutes in
      const stop =
        how === "stopped"
          ? a.make("timer.stopped", {
              timerId: started.payload.timerId,
              stoppedAt: new Date(now - 45 * 60_000).toISOString(),
              reason: "Cases came apart",
            })
          : a.make("timer.cancelled", { timerId: started.payload.timerId, reason: "Started before the sealant went on" });
      const late = await mergeBatch(db, mech, a.batch([stop]));
      expect(late.accepted).toEqual([stop.id]);
      expect(late.flagged.map((f) => f.id)).toEqual([stop.id]);
      expect(late.flagged[0].reason).toMatch(
        new RegExp(
          `^“Sealant cure before oil and cranking” was ${how === "stopped" ? "stopped before its time was up" : "cancelled"}, and this reached the server after work on step “.+” \\(from .+ UTC\\) had been accepted as done after the wait`,
        ),
      );
      expect(await opRow(stop.id)).toMatchObject({ flagged: true });
    }
  });

  it("a cure stopped after it ran its time flags nothing", async () => {
    const { specs, mech, mech2, a, b } = await setup();
    const now = Date.now();
    const started = cure(a, specs, now - 50 * 60_000);
    await mergeBatch(db, mech, a.batch([started]));
    expect((await mergeBatch(db, mech2, b.batch([b.complete(specs.oilPrimeStepId)]))).flagged).toEqual([]);
    const stop = a.make("timer.stopped", { timerId: started.payload.timerId, stoppedAt: new Date(now - 15 * 60_000).toISOString() });
    const r = await mergeBatch(db, mech, a.batch([stop]));
    expect(r.accepted).toEqual([stop.id]);
    expect(r.flagged).toEqual([]);
  });

  it("work on the held step stamped during the cure is kept and flagged; after the cure it is accepted", async () => {
    const now = Date.now();
    let clock = now - 40 * 60_000;
    const { fx, specs, mech } = await setup();
    const t = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId, () => clock);
    const start = cure(t, specs, clock);
    clock += 10 * 60_000; // 10 minutes into the 30-minute cure
    const early = t.complete(specs.oilPrimeStepId);
    const res = await mergeBatch(db, mech, t.batch([start, early]));
    expect(res.flagged).toEqual([
      {
        id: early.id,
        reason: expect.stringMatching(
          /^Step “Fill with oil and prime the oil system” was on hold when this was recorded \(.* UTC\): “Sealant cure before oil and cranking” was running until/,
        ),
      },
    ]);
    const completion = await db.selectFrom("step_completions").select("id").where("id", "=", early.id).execute();
    expect(completion).toHaveLength(1); // kept, never dropped
    clock = now - 5 * 60_000; // 35 minutes after the start: the cure is over
    const later = t.complete(specs.oilPrimeStepId);
    expect((await mergeBatch(db, mech, t.batch([later]))).flagged).toEqual([]);
  });

  it("a timer stopped early (with who and why) keeps holding; a cancelled one is marked and counts for nothing; a second one is flagged", async () => {
    const { fx, specs, mech, mech2, a, b } = await setup();
    const now = Date.now();
    const first = cure(a, specs, now - 50 * 60_000);
    const second = cure(b, specs, now - 48 * 60_000);
    await mergeBatch(db, mech, a.batch([first]));
    const res2 = await mergeBatch(db, mech2, b.batch([second]));
    expect(res2.flagged[0].reason).toMatch(/^A second “Sealant cure before oil and cranking” timer was started while one started at/);
    const stop = a.make("timer.stopped", {
      timerId: first.payload.timerId,
      stoppedAt: new Date(now - 45 * 60_000).toISOString(),
      reason: "Cases had to come apart",
    });
    const cancelOther = a.make("timer.cancelled", { timerId: second.payload.timerId, reason: "started twice" });
    const cancel = b.make("timer.cancelled", { timerId: second.payload.timerId, reason: "started on a second tablet by mistake" });
    const r1 = await mergeBatch(db, mech, a.batch([stop, cancelOther]));
    expect(r1.refused).toEqual([{ id: cancelOther.id, reason: expect.stringContaining("Only the person who started this timer") }]);
    await mergeBatch(db, mech2, b.batch([cancel]));
    const timers = await db
      .selectFrom("timers")
      .select(["id", "stopped_by", "stop_reason", "cancelled_by", "cancel_reason"])
      .where("work_order_id", "=", fx.workOrderId)
      .orderBy("started_at")
      .execute();
    expect(timers).toEqual([
      { id: first.payload.timerId, stopped_by: mech.id, stop_reason: "Cases had to come apart", cancelled_by: null, cancel_reason: null },
      {
        id: second.payload.timerId,
        stopped_by: null,
        stop_reason: null,
        cancelled_by: mech2.id,
        cancel_reason: "started on a second tablet by mistake",
      },
    ]);
    // the only counting timer was stopped early: the oil fill is still held long after
    const late = a.complete(specs.oilPrimeStepId);
    expect((await mergeBatch(db, mech, a.batch([late]))).flagged[0].reason).toContain("had been stopped before its time was up");
  });
});

describe("withdrawing an entry", () => {
  it("a withdrawn bolt stays on record, marked, and no longer counts: snapshot, review, report and office record say so", async () => {
    const { fx, specs, mech, sup, a } = await setup();
    const bolts = [1, 2].flatMap((bolt) => [1, 2, 3].map((pass) => a.bolt(specs.rodStepId, specs.rodSpecId, pass, bolt)));
    await mergeBatch(db, mech, a.batch(bolts));
    const wrong = bolts[2]; // bolt 1, pass 3
    const take = a.make("entry.withdrawn", { operationId: wrong.id, reason: "Angle pass not reached: wrench slipped" });
    expect((await mergeBatch(db, mech, a.batch([take]))).accepted).toEqual([take.id]);

    expect(await db.selectFrom("torque_records").select("id").where("id", "=", wrong.id).execute()).toHaveLength(1);
    const snap = (await getJobSnapshot(db, mech, fx.workOrderId))!;
    expect(snap.state.withdrawals).toEqual([
      {
        id: take.id,
        operationId: wrong.id,
        kind: "torque.bolt-confirmed",
        withdrawnBy: mech.id,
        reason: "Angle pass not reached: wrench slipped",
        deviceTime: take.deviceTime,
        receivedAt: expect.any(String),
      },
    ]);

    const signOff = a.make("stage.signed-off", { jobProcedureId: fx.procedures[0].id, stageKey: "assemble" });
    await mergeBatch(db, mech, a.batch([signOff]));
    const review = (await loadSignOffReview(db, sup, signOff.id))!;
    const rod = review.steps.flatMap((s) => s.torque).find((t) => t.id === specs.rodSpecId)!;
    const cell = rod.passes[2].bolts[0];
    expect(cell.done).toBeNull();
    expect(cell.records).toMatchObject([
      { id: wrong.id, withdrawn: { by: { id: mech.id }, reason: "Angle pass not reached: wrench slipped" } },
    ]);
    expect(rod.complete).toBe(false);
    expect(review.withdrawnCount).toBe(1);

    const listed = await withdrawnEntries(db, fx.shopId, { workOrderId: fx.workOrderId });
    expect(listed).toMatchObject([
      { what: "Bolt 1, pass 3 of Rod cap bolts, rod 1 at “Torque connecting-rod bolts”", reason: "Angle pass not reached: wrench slipped" },
    ]);
    const text = await pdfText(await renderHandoverReportPdf(db, fx.shopId, fx.workOrderId));
    expect(text).toContain("Withdrawn entries");
    expect(text).toContain("Angle pass not reached: wrench slipped");
    expect(text).toMatch(/Rod cap bolts, rod 1 .*5 of 6/);
  });

  it("a mechanic cannot withdraw someone else's entry (refused, with the reason, in the audit log); a supervisor can", async () => {
    const { fx, specs, mech, mech2, sup, a, b, s } = await setup();
    const theirs = a.bolt(specs.caseBoltsStepId, specs.caseBoltsSpecId, 1, 1);
    await mergeBatch(db, mech, a.batch([theirs]));
    const forged = b.make("entry.withdrawn", { operationId: theirs.id, reason: "not needed" });
    const res = await mergeBatch(db, mech2, b.batch([forged]));
    expect(res.refused).toEqual([{ id: forged.id, reason: expect.stringContaining("a mechanic cannot take back someone else's entry") }]);
    const audit = await db.selectFrom("audit_log").select(["outcome", "reason"]).where("entity_id", "=", forged.id).execute();
    expect(audit).toEqual([{ outcome: "refused", reason: expect.stringContaining("Only the person who recorded this torque bolt") }]);
    const bySup = s.make("entry.withdrawn", { operationId: theirs.id, reason: "Recorded on the wrong job" });
    expect((await mergeBatch(db, sup, s.batch([bySup]))).accepted).toEqual([bySup.id]);
    // the first withdrawal stands; a later one stays in the operations only
    const again = a.make("entry.withdrawn", { operationId: theirs.id, reason: "also mine to take back" });
    expect((await mergeBatch(db, mech, a.batch([again]))).accepted).toEqual([again.id]);
    const rows = await db.selectFrom("withdrawals").select(["id", "withdrawn_by"]).where("operation_id", "=", theirs.id).execute();
    expect(rows).toEqual([{ id: bySup.id, withdrawn_by: sup.id }]);
    await expect(db.deleteFrom("withdrawals").where("id", "=", bySup.id).execute()).rejects.toThrow(/append-only/);
    expect(fx.workOrderId).toBeTruthy();
  });

  it("a withdrawn sign-off leaves the review queue and cannot be decided on; a part and a photo withdrawn are marked on the office's record", async () => {
    const { fx, specs, mech, sup, a } = await setup();
    const part = a.make("part.fitted", {
      partFittedId: randomUUID(),
      stepId: specs.rodStepId,
      partNumber: "GS-RB-8",
      description: "Rod bolt",
      batch: "RB-2612",
      quantity: 2,
    });
    const photo = a.make("photo.queued", {
      attachmentId: randomUUID(),
      stepId: specs.rodStepId,
      contentType: "image/jpeg",
      byteSize: 1000,
    });
    const signOff = a.make("stage.signed-off", { jobProcedureId: fx.procedures[0].id, stageKey: "measure" });
    await mergeBatch(db, mech, a.batch([part, photo, signOff]));
    const queued = () => pageReviewQueue(db, fx.shopId, queueQuerySchema.parse({}));
    expect((await queued()).rows.map((r) => r.signOffId)).toContain(signOff.id);
    await mergeBatch(
      db,
      mech,
      a.batch([
        a.make("entry.withdrawn", { operationId: signOff.id, reason: "Signed off the wrong stage" }),
        a.make("entry.withdrawn", { operationId: part.id, reason: "Batch number misread" }),
        a.make("entry.withdrawn", { operationId: photo.id, reason: "Photo of the wrong engine" }),
      ]),
    );
    expect((await queued()).rows.map((r) => r.signOffId)).not.toContain(signOff.id);
    const decision = await decideOnSignOff(db, sup, signOff.id, {
      decision: "approved",
      acceptances: [],
      flagAcceptances: [],
      expectedDecisionId: null,
    });
    expect(decision).toMatchObject({ ok: false, status: 409, reason: expect.stringContaining("was withdrawn") });
    const record = (await bikeRecord(db, fx.shopId, fx.bike.id))!;
    expect(record.parts.map((p) => [p.partNumber, p.withdrawnReason])).toEqual([["GS-RB-8", "Batch number misread"]]);
    expect(record.withdrawn.map((w) => w.what)).toEqual([
      "Sign-off of stage “Measure before assembly”",
      "2 × GS-RB-8 Rod bolt (batch RB-2612) at “Torque connecting-rod bolts”",
      "A photo at “Torque connecting-rod bolts”",
    ]);
  });
});

describe("readings keep their digits", () => {
  it('"0.030" is stored, sent, reviewed, listed, exported and printed as "0.030"; a number from an older tablet as it printed', async () => {
    const { fx, mech, sup, a } = await setup();
    const spec = await db
      .selectFrom("measurement_specs")
      .select(["id", "step_id"])
      .where("key", "=", "main-oil-clearance")
      .where("step_id", "=", fx.stepByKey["main-clearance"].id)
      .executeTakeFirstOrThrow();
    const typed = a.read(spec.step_id, spec.id, 0, "0.030");
    const older = a.read(spec.step_id, spec.id, 1, 0.031);
    // through the route, as the tablet sends it: the value as a decimal string
    const post = (body: unknown) =>
      syncRoute.handle(
        appRequest("/api/sync", { method: "POST", body: JSON.stringify(body), headers: { "content-type": "application/json" } }),
        {
          user: mech,
          db,
        },
      );
    // an older tablet sent the value as a JSON number
    const asNumber = JSON.parse(JSON.stringify(older).replace('"value":"0.031"', '"value":0.031')) as unknown;
    const ok = await post({ ...a.batch([typed]), operations: [typed, asNumber] });
    expect(ok.status).toBe(200);
    const stored = await sql<{
      value: string;
    }>`SELECT value::text AS value FROM measurements WHERE id = ANY(${[typed.id, older.id]}::uuid[]) ORDER BY reading_index`.execute(db);
    expect(stored.rows.map((r) => r.value)).toEqual(["0.030", "0.031"]);

    const snap = (await getJobSnapshot(db, mech, fx.workOrderId))!;
    expect(snap.state.readings.find((r) => r.id === typed.id)).toMatchObject({ value: 0.03, valueText: "0.030" });

    const signOff = a.make("stage.signed-off", { jobProcedureId: fx.procedures[0].id, stageKey: "measure" });
    await mergeBatch(db, mech, a.batch([signOff]));
    const review = (await loadSignOffReview(db, sup, signOff.id))!;
    const spot = review.steps.flatMap((s) => s.specs).find((s) => s.id === spec.id)!.spots[0];
    expect(spot.current?.value).toBe("0.030");

    const record = (await bikeRecord(db, fx.shopId, fx.bike.id))!;
    expect(record.measurements.find((m) => m.id === typed.id)?.value).toBe("0.030");

    const csvRes = await readingsCsvRoute.handle(appRequest(`/api/office/bikes/${fx.bike.id}/readings`), {
      user: mech,
      db,
      params: { id: fx.bike.id },
    });
    expect(csvRes.status).toBe(200);
    expect(csvRes.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    const csv = await csvRes.text();
    expect(csv.split("\r\n")[0]).toBe("work_order,step,reading,value,unit,min,max,verdict,standing,recorded_by,recorded_at");
    expect(csv).toMatch(/,"Main bearing oil clearance, Main 1",0\.030,mm,0\.02,0\.044,in,current,/);

    const text = await pdfText(await renderHandoverReportPdf(db, fx.shopId, fx.workOrderId));
    expect(text).toContain("0.030 mm");
    expect(text).not.toMatch(/Main 1 0\.03 mm/);
  });

  it('a wrench reading typed "31.50" is stored, sent and reviewed as "31.50"; a number from an older tablet as it printed', async () => {
    const { fx, specs, mech, sup, a } = await setup();
    const typed = a.bolt(specs.rodStepId, specs.rodSpecId, 1, 1);
    typed.payload = { ...typed.payload, wrenchReading: "31.50", wrenchUnit: "N·m" };
    const older = a.bolt(specs.rodStepId, specs.rodSpecId, 1, 2);
    const asNumber = { ...older, payload: { ...older.payload, wrenchReading: 31.5, wrenchUnit: "N·m" } };
    const res = await syncRoute.handle(
      appRequest("/api/sync", {
        method: "POST",
        body: JSON.stringify({ ...a.batch([typed]), operations: [typed, asNumber] }),
        headers: { "content-type": "application/json" },
      }),
      { user: mech, db },
    );
    expect(res.status).toBe(200);
    expect(((await res.json()) as { accepted: string[] }).accepted).toEqual([typed.id, older.id]);
    const stored = await sql<{ id: string; reading: string }>`
      SELECT id, wrench_reading::text AS reading FROM torque_records WHERE id = ANY(${[typed.id, older.id]}::uuid[]) ORDER BY bolt`.execute(
      db,
    );
    expect(stored.rows.map((r) => r.reading)).toEqual(["31.50", "31.5"]);
    const snap = (await getJobSnapshot(db, mech, fx.workOrderId))!;
    expect(snap.state.torqueRecords.find((t) => t.id === typed.id)).toMatchObject({ wrenchReading: 31.5, wrenchReadingText: "31.50" });

    const signOff = a.make("stage.signed-off", { jobProcedureId: fx.procedures[0].id, stageKey: "assemble" });
    await mergeBatch(db, mech, a.batch([signOff]));
    const review = (await loadSignOffReview(db, sup, signOff.id))!;
    const rod = review.steps.flatMap((s) => s.torque).find((t) => t.id === specs.rodSpecId)!;
    expect(rod.passes[0].bolts[0].records).toMatchObject([{ id: typed.id, wrench: "31.50 N·m" }]);
    expect(rod.passes[0].bolts[1].records).toMatchObject([{ id: older.id, wrench: "31.5 N·m" }]);
  });

  it("the wire format refuses an absurd reading or wrench value per entry, with the field and the rule in workshop words", async () => {
    const { specs, mech, a } = await setup();
    const absurd = a.read(specs.boreStepId, specs.boreSpecId, 0, "99999");
    const wrench = { ...a.bolt(specs.caseBoltsStepId, specs.caseBoltsSpecId, 1, 1) };
    const body = a.batch([absurd]);
    const res = await syncRoute.handle(
      appRequest("/api/sync", { method: "POST", body: JSON.stringify(body), headers: { "content-type": "application/json" } }),
      { user: mech, db },
    );
    // refused alone, with the reason, while the rest of a batch would merge (each entry is checked on its own)
    expect(res.status).toBe(200);
    expect(((await res.json()) as { refused: Array<{ id: string; reason: string }> }).refused).toEqual([
      {
        id: absurd.id,
        reason: expect.stringContaining(
          "Value: 99999 mm is beyond anything on an engine (the most is 2000 mm); check the instrument and type it again.",
        ),
      },
    ]);
    const tooTight = { ...wrench, payload: { ...wrench.payload, wrenchReading: "99999", wrenchUnit: "N·m" as const } };
    const res2 = await syncRoute.handle(
      appRequest("/api/sync", {
        method: "POST",
        body: JSON.stringify(a.batch([tooTight])),
        headers: { "content-type": "application/json" },
      }),
      { user: mech, db },
    );
    expect(res2.status).toBe(200);
    expect(((await res2.json()) as { refused: Array<{ id: string; reason: string }> }).refused).toEqual([
      {
        id: tooTight.id,
        reason: expect.stringContaining(
          "Wrench reading: 99999 N·m is beyond any fastener on an engine (the most is 2000 N·m); check the wrench and type it again.",
        ),
      },
    ]);
  });
});
