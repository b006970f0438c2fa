import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { POST as decideRoute } from "@/app/api/review/sign-offs/[id]/decisions/route";
import { GET as reportRoute } from "@/app/api/jobs/[id]/build-report/route";
import { POST as withdrawRoute } from "@/app/api/jobs/[id]/dyno-runs/[runId]/withdraw/route";
import { getObject } from "@/app/_server/object-store";
import { addPartFitted } from "@/db/office/parts";
import { importDynoRun } from "@/db/records/dyno-import";
import { loadOpenItems } from "@/db/records/open-items";
import { loadSignOffReview } from "@/db/review/detail";
import { countReviewQueue, pageReviewQueue } from "@/db/review/queue";
import { addNote, assignMechanic } from "@/db/shop/work-orders";
import { queueQuerySchema } from "@/lib/review/list-queries";
import type { SessionUser } from "@/lib/auth/session-user";
import { closeOutJob, finishEverything, handOverByOverride, stageWork, type CloseOutJob } from "./support/close-out";
import { useFakes } from "./support/fakes";
import { pdfText } from "./support/pdf-text";
import { sync } from "./support/review-bench";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
useFakes();

const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
const queue = (job: CloseOutJob, shopId = job.fx.shopId) => pageReviewQueue(db, shopId, queueQuerySchema.parse({ job: "2" }));
const customer = (job: CloseOutJob): SessionUser => ({
  id: job.fx.users.customer.id,
  shopId: job.fx.shopId,
  role: "customer",
  name: job.fx.users.customer.name,
  email: job.fx.users.customer.email,
  customerId: job.fx.customerId,
});

async function download(job: CloseOutJob, user: SessionUser, revision?: number) {
  const res = await reportRoute.handle(appRequest(`/api/jobs/${job.workOrderId}/build-report${revision ? `?revision=${revision}` : ""}`), {
    user,
    db,
    params: { id: job.workOrderId },
  });
  return { res, bytes: new Uint8Array(await res.arrayBuffer()) };
}

const handOverNow = (job: CloseOutJob, reason?: string) => handOverByOverride(db, job, reason);

/** The current reading of the left cover gap (the first reading of the check stage). */
const leftGapReading = (job: CloseOutJob) =>
  db
    .selectFrom("current_measurements")
    .select("id")
    .where("work_order_id", "=", job.workOrderId)
    .where("reading_index", "=", 0)
    .executeTakeFirstOrThrow();

/** The decision standing on a sign-off (its newest). */
const standingDecision = async (signOffId: string) =>
  (
    await db
      .selectFrom("review_decisions")
      .select("id")
      .where("sign_off_id", "=", signOffId)
      .orderBy("change_seq", "desc")
      .executeTakeFirstOrThrow()
  ).id;

/** A decision as the review screen sends it: with the record it showed (`seenUpTo`, read now). */
const decide = async (job: CloseOutJob, signOffId: string, body: object, user: SessionUser = job.users.sup) =>
  decideRoute.handle(
    appRequest(`/api/review/sign-offs/${signOffId}/decisions`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ seenUpTo: (await loadSignOffReview(db, user, signOffId))!.seenUpTo, ...body }),
    }),
    { user, db, params: { id: signOffId } },
  );

describe("the review queue keeps every undecided sign-off, whatever the job's state (real PostgreSQL)", () => {
  it("a job handed over by override with an undecided sign-off is in the queue as such; approving it makes a new report revision", async () => {
    const job = await closeOutJob(db);
    const w = stageWork(job, "check");
    await sync(db, job.users.mech, job.tablet, w.ops);
    expect((await queue(job)).rows.map((r) => [r.signOffId, r.jobStatus])).toEqual([[w.signOff.id, "on_dyno"]]);
    const before = await countReviewQueue(db, job.fx.shopId);

    await handOverNow(job);
    const q = await queue(job);
    expect(q.rows).toEqual([
      expect.objectContaining({
        signOffId: w.signOff.id,
        jobStatus: "handed_over",
        handedOverWithOpenItems: true,
        backAfterApproval: null,
      }),
    ]);
    expect(await countReviewQueue(db, job.fx.shopId)).toBe(before);

    // the decision on the closed job is an accepted change: revision 2, listing what changed
    const r = await decide(job, w.signOff.id, { decision: "approved", expectedDecisionId: null });
    expect(r.status).toBe(201);
    expect(await r.json()).toMatchObject({ decision: "approved", closedJob: true, reportRevision: 2 });
    expect((await queue(job)).rows).toEqual([]);
    const revs = await db
      .selectFrom("report_revisions")
      .select(["revision", "handed_over", "changes"])
      .where("work_order_id", "=", job.workOrderId)
      .orderBy("revision")
      .execute();
    expect(revs.map((x) => [x.revision, x.handed_over])).toEqual([
      [1, true],
      [2, false],
    ]);
    expect(revs[1].changes).toContainEqual(
      expect.stringMatching(/^Changed: Sign-offs and reviews: Check the gap: .*waiting for review → .*Approved by sup/),
    );
    expect(revs[1].changes).toContainEqual(
      expect.stringMatching(/^No longer: Still open: Check the gap: Signed off, but no supervisor has approved it yet\./),
    );
  });
});

describe("the frozen report (real PostgreSQL, s3rver)", () => {
  it("is stored at handover with its SHA-256; the customer's link serves those very bytes, whatever comes in later", async () => {
    const job = await closeOutJob(db);
    await finishEverything(db, job);
    const { report } = await handOverNow(job);
    const row = await db.selectFrom("report_revisions").selectAll().where("work_order_id", "=", job.workOrderId).executeTakeFirstOrThrow();
    expect(row).toMatchObject({ revision: 1, handed_over: true, sha256: report.sha256, made_by: job.users.office.id });
    const stored = (await getObject(row.object_key)).body;
    expect(sha(stored)).toBe(row.sha256);
    expect(stored.length).toBe(row.byte_size);
    expect(await pdfText(stored, [1])).toContain("Revision 1: the report as handed over on");

    const first = await download(job, customer(job));
    expect(first.res.status).toBe(200);
    expect(first.res.headers.get("x-report-sha256")).toBe(row.sha256);
    expect(first.res.headers.get("content-disposition")).toContain("revision-1.pdf");
    expect(sha(first.bytes)).toBe(row.sha256);

    // late bench work on the closed job is kept and flagged; nobody has accepted it: the copy stays
    const late = await sync(db, job.users.mech, job.tablet, [job.tablet.read(job.steps["measure-gap"], job.specId, 1, 0.19)]);
    expect(late.flagged).toHaveLength(1);
    const again = await download(job, customer(job));
    expect(sha(again.bytes)).toBe(row.sha256);
    expect(await db.selectFrom("report_revisions").select("id").where("work_order_id", "=", job.workOrderId).execute()).toHaveLength(1);
    await expect(db.deleteFrom("report_revisions").where("id", "=", row.id).execute()).rejects.toThrow(/append-only/);

    // a revision that does not exist, and a bad one, in workshop words
    const none = await download(job, customer(job), 7);
    expect(none.res.status).toBe(404);
    const bad = await reportRoute.handle(appRequest(`/api/jobs/${job.workOrderId}/build-report?revision=abc`), {
      user: customer(job),
      db,
      params: { id: job.workOrderId },
    });
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues).toEqual([{ path: "revision", message: "Revision: a whole number from 1." }]);
  });

  it("a late flagged change accepted by the supervisor makes revision 2, listing what changed; revision 1 stays byte for byte", async () => {
    const job = await closeOutJob(db);
    const [checkSignOff] = await finishEverything(db, job);
    await handOverNow(job);
    const r1 = await download(job, customer(job), 1);

    // a correction of the left reading arrives from a tablet after handover: kept, flagged
    const left = await leftGapReading(job);
    const fix = job.tablet.read(job.steps["measure-gap"], job.specId, 0, 0.17, { supersedesId: left.id });
    expect((await sync(db, job.users.mech, job.tablet, [fix])).flagged.map((f) => f.id)).toEqual([fix.id]);

    // the approved stage is back in the queue: new flagged work after approval
    expect((await queue(job)).rows).toEqual([
      expect.objectContaining({
        signOffId: checkSignOff,
        backAfterApproval: "flagged",
        jobStatus: "handed_over",
        handedOverWithOpenItems: false,
      }),
    ]);
    const items = await loadOpenItems(db, job.fx.shopId, job.workOrderId);
    expect(items!.map((i) => i.kind)).toEqual(["flagged_not_accepted"]);

    // approving again without accepting the entry is refused; with it, revision 2
    const standing = await standingDecision(checkSignOff);
    const refused = await decide(job, checkSignOff, { decision: "approved", expectedDecisionId: standing });
    expect(refused.status).toBe(422);
    expect(await db.selectFrom("report_revisions").select("id").where("work_order_id", "=", job.workOrderId).execute()).toHaveLength(1);
    const ok = await decide(job, checkSignOff, {
      decision: "approved",
      expectedDecisionId: standing,
      flagAcceptances: [{ operationId: fix.id, justification: "Remeasured with the new feeler set; 0.17 mm is right" }],
    });
    expect(ok.status).toBe(201);
    expect((await ok.json()).reportRevision).toBe(2);
    expect((await queue(job)).rows).toEqual([]);

    const rev2 = await db
      .selectFrom("report_revisions")
      .selectAll()
      .where("work_order_id", "=", job.workOrderId)
      .where("revision", "=", 2)
      .executeTakeFirstOrThrow();
    expect(rev2.handed_over).toBe(false);
    expect(rev2.changes).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/^Changed: Measurements: Cover gap, Left: 0\.15 mm .* → 0\.17 mm .*flagged/),
        expect.stringMatching(
          /^Added: Flagged entries: Reading: 0\.17 mm \(a correction\), at Measure the gap, .*closed .*Accepted by sup .*: Remeasured with the new feeler set/,
        ),
      ]),
    );
    const latest = await download(job, customer(job));
    expect(latest.res.headers.get("x-report-revision")).toBe("2");
    expect(sha(latest.bytes)).toBe(rev2.sha256);
    const page1 = await pdfText(latest.bytes, [1]);
    expect(page1).toContain("Revision 2 of the report handed over on");
    expect(page1).toContain("Changed since revision 1:");
    // revision 1, as handed over, is still served byte for byte
    const again1 = await download(job, customer(job), 1);
    expect(sha(again1.bytes)).toBe(sha(r1.bytes));
    // reading the report again makes nothing new
    await download(job, customer(job));
    expect(await db.selectFrom("report_revisions").select("id").where("work_order_id", "=", job.workOrderId).execute()).toHaveLength(2);
  });
});

describe("a revision prints the record as accepted (real PostgreSQL)", () => {
  it("while late work on one stage waits for the supervisor, accepting late work on another makes no revision; accepting the rest makes it, with both", async () => {
    const job = await closeOutJob(db);
    const [checkSignOff, closeSignOff] = await finishEverything(db, job);
    await handOverNow(job);
    const revisions = async () =>
      (
        await db
          .selectFrom("report_revisions")
          .select("revision")
          .where("work_order_id", "=", job.workOrderId)
          .orderBy("revision")
          .execute()
      ).map((r) => r.revision);
    expect(await revisions()).toEqual([1]);

    // after handover: a correction of the left gap on the check stage, and the seal step done again on the close stage
    const left = await leftGapReading(job);
    const fix = job.tablet.read(job.steps["measure-gap"], job.specId, 0, 0.19, { supersedesId: left.id });
    const reseal = job.tablet.complete(job.steps.seal);
    expect((await sync(db, job.users.mech, job.tablet, [fix, reseal])).flagged.map((f) => f.id).sort()).toEqual([fix.id, reseal.id].sort());

    // the supervisor accepts the reseal only: an accepted change, but the correction still waits, so no revision
    const closeOk = await decide(job, closeSignOff, {
      decision: "approved",
      expectedDecisionId: await standingDecision(closeSignOff),
      flagAcceptances: [{ operationId: reseal.id, justification: "Seal checked again after the customer asked; fine" }],
    });
    expect(closeOk.status).toBe(201);
    expect((await closeOk.json()).reportRevision).toBeNull();
    const served = await download(job, customer(job));
    expect(served.res.headers.get("x-report-revision")).toBe("1");
    expect(await revisions()).toEqual([1]);
    expect(await pdfText(served.bytes)).not.toContain("0.19");

    // the correction accepted too: revision 2, with both changes and the corrected gap
    const checkOk = await decide(job, checkSignOff, {
      decision: "approved",
      expectedDecisionId: await standingDecision(checkSignOff),
      flagAcceptances: [{ operationId: fix.id, justification: "Remeasured with the new feeler set; 0.19 mm is right" }],
    });
    expect(checkOk.status).toBe(201);
    expect((await checkOk.json()).reportRevision).toBe(2);
    const rev2 = await db
      .selectFrom("report_revisions")
      .select("changes")
      .where("work_order_id", "=", job.workOrderId)
      .where("revision", "=", 2)
      .executeTakeFirstOrThrow();
    expect(rev2.changes).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/^Changed: Measurements: Cover gap, Left: 0\.15 mm .* → 0\.19 mm/),
        expect.stringMatching(/^Added: Flagged entries: Step done.*Seal and label.*Seal checked again/),
      ]),
    );
    expect(await revisions()).toEqual([1, 2]);
  });
});

describe("a closed record stays closed (real PostgreSQL)", () => {
  const run = (label: string) => ({
    label,
    ranOn: "2026-11-28",
    boostTarget: "9",
    boostUnit: "psi",
    pressureKpa: "100.8",
    temperatureC: "18",
    humidityPercent: "60",
    standard: "SAE_J1349",
    notes: "",
    curve: { source: "csv", text: "rpm,torque_nm\n5000,80\n7000,95\n9000,90\n" },
  });

  it("dyno runs: only the job's mechanic, a supervisor or the office; every one in the audit log; refused after handover", async () => {
    const job = await closeOutJob(db);
    const other = job.fx.users.mechanic2;
    await expect(importDynoRun(db, job.fx.shopId, job.workOrderId, other.id, run("Not my job"))).rejects.toMatchObject({
      status: 403,
      message: "Only the job's mechanic, a supervisor or the office may record a dyno run on this work order.",
    });
    const mine = await importDynoRun(db, job.fx.shopId, job.workOrderId, job.users.mech.id, run("Baseline"));
    const sup = await importDynoRun(db, job.fx.shopId, job.workOrderId, job.users.sup.id, run("Check pull"));
    const office = await importDynoRun(db, job.fx.shopId, job.workOrderId, job.users.office.id, run("Office entry"));
    expect([mine.ok, sup.ok, office.ok]).toEqual([true, true, true]);
    const made = await db
      .selectFrom("audit_log")
      .select(["actor_id", "outcome", "entity_id"])
      .where("work_order_id", "=", job.workOrderId)
      .where("action", "=", "dyno.run-recorded")
      .orderBy("id")
      .execute();
    expect(made.map((a) => [a.actor_id, a.outcome])).toEqual([
      [other.id, "refused"],
      [job.users.mech.id, "accepted"],
      [job.users.sup.id, "accepted"],
      [job.users.office.id, "accepted"],
    ]);
    expect(made[1].entity_id).toBe(mine.ok ? mine.id : null);

    await finishEverything(db, job);
    await handOverNow(job);
    const runsBefore = await db.selectFrom("dyno_runs").select("id").where("work_order_id", "=", job.workOrderId).execute();
    await expect(importDynoRun(db, job.fx.shopId, job.workOrderId, job.users.mech.id, run("After handover"))).rejects.toMatchObject({
      status: 409,
      message: expect.stringMatching(
        /^Work order #2 is handed over: its record is closed\. A dyno run for a bike that has left belongs on a new work order/,
      ),
    });
    expect(await db.selectFrom("dyno_runs").select("id").where("work_order_id", "=", job.workOrderId).execute()).toEqual(runsBefore);

    // withdrawing a run recorded by mistake stays possible: audited, and a new report revision
    const w = await withdrawRoute.handle(
      appRequest(`/api/jobs/${job.workOrderId}/dyno-runs/${office.ok ? office.id : ""}/withdraw`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ reason: "Entered on the wrong job by the office" }),
      }),
      { user: job.users.office, db, params: { id: job.workOrderId, runId: office.ok ? office.id : "" } },
    );
    expect(w.status).toBe(200);
    expect(await w.json()).toMatchObject({ withdrawn: true, reportRevision: 2 });
    const rev2 = await db
      .selectFrom("report_revisions")
      .select("changes")
      .where("work_order_id", "=", job.workOrderId)
      .where("revision", "=", 2)
      .executeTakeFirstOrThrow();
    expect(rev2.changes).toContainEqual(expect.stringMatching(/^No longer: Dyno results: Office entry/));
    const withdrawn = await db
      .selectFrom("audit_log")
      .select("outcome")
      .where("work_order_id", "=", job.workOrderId)
      .where("action", "=", "dyno.run-withdrawn")
      .execute();
    expect(withdrawn).toEqual([{ outcome: "accepted" }]);
  });

  it("parts, notes and a change of mechanic from the office are refused after handover, audited, nothing saved", async () => {
    const job = await closeOutJob(db);
    await finishEverything(db, job);
    await handOverNow(job);
    const office = job.users.office.id;
    await expect(addPartFitted(db, job.fx.shopId, office, job.workOrderId, { partNumber: "GS-1", serial: "S-1" })).rejects.toMatchObject({
      status: 409,
      message: expect.stringMatching(/is handed over: its record is closed\. A part for a bike that has left/),
    });
    await expect(addNote(db, job.fx.shopId, office, job.workOrderId, "general", "Customer rang about a rattle")).rejects.toMatchObject({
      status: 409,
    });
    await expect(assignMechanic(db, job.fx.shopId, office, job.workOrderId, job.fx.users.mechanic2.id)).rejects.toMatchObject({
      status: 409,
    });
    expect(await db.selectFrom("parts_fitted").select("id").where("work_order_id", "=", job.workOrderId).execute()).toEqual([]);
    expect(await db.selectFrom("work_order_notes").select("id").where("work_order_id", "=", job.workOrderId).execute()).toEqual([]);
    const wo = await db
      .selectFrom("work_orders")
      .select("assigned_mechanic_id")
      .where("id", "=", job.workOrderId)
      .executeTakeFirstOrThrow();
    expect(wo.assigned_mechanic_id).toBe(job.users.mech.id);
    const refused = await db
      .selectFrom("audit_log")
      .select("action")
      .where("work_order_id", "=", job.workOrderId)
      .where("outcome", "=", "refused")
      .where("action", "like", "work_order.add-%")
      .orderBy("id")
      .execute();
    expect(refused.map((r) => r.action)).toEqual(["work_order.add-part", "work_order.add-note", "work_order.add-mechanic-assignment"]);
  });
});
