import { describe, expect, it } from "vitest";
import { POST as acceptRoute } from "@/app/api/jobs/[id]/flagged-entries/[entryId]/acceptance/route";
import { loadOpenItems } from "@/db/records/open-items";
import { decideOnSignOff } from "@/db/review/decide";
import { entriesToAcceptOnTheirOwn } from "@/db/review/entry-acceptance";
import type { SessionUser } from "@/lib/auth/session-user";
import { Tablet } from "../bench/sync-ops";
import { closeOutJob, handOverByOverride, stageWork, type CloseOutJob } from "./support/close-out";
import { useFakes } from "./support/fakes";
import { sync } from "./support/review-bench";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
useFakes();

// A flagged entry that arrives after a job closed, on a stage no sign-off can carry (never signed
// off, or its sign-off withdrawn, the job handed over by override), is accepted on its own, in
// writing: otherwise it stays open for good and no revision of the stored report is ever made.

const accept = (job: CloseOutJob, entryId: string, body: object, user: SessionUser) =>
  acceptRoute.handle(
    appRequest(`/api/jobs/${job.workOrderId}/flagged-entries/${entryId}/acceptance`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(body),
    }),
    { user, db, params: { id: job.workOrderId, entryId } },
  );

const revisions = async (job: CloseOutJob) =>
  (
    await db.selectFrom("report_revisions").select("revision").where("work_order_id", "=", job.workOrderId).orderBy("revision").execute()
  ).map((r) => r.revision);

/** The audit entries of acceptances on their own for one job, in order: outcome and reason. */
const auditOf = async (workOrderId: string) =>
  (
    await db
      .selectFrom("audit_log")
      .select(["outcome", "reason"])
      .where("action", "=", "review.accept-entry")
      .where("work_order_id", "=", workOrderId)
      .orderBy("id")
      .execute()
  ).map((a) => [a.outcome, a.reason]);

/** Ready then handed over with the office's written override of what is open. */
const handOverWithOverride = (job: CloseOutJob) =>
  handOverByOverride(db, job, "Customer collects today; the check stage is signed off on paper");

/** The check stage worked but never signed off; the close stage signed off and approved; handed over by override. */
async function closedWithUnsignedStage() {
  const job = await closeOutJob(db);
  const check = stageWork(job, "check");
  await sync(
    db,
    job.users.mech,
    job.tablet,
    check.ops.filter((o) => o.id !== check.signOff.id),
  );
  const close = stageWork(job, "close");
  await sync(db, job.users.mech, job.tablet, close.ops);
  const d = await decideOnSignOff(db, job.users.sup, close.signOff.id, {
    decision: "approved",
    expectedDecisionId: null,
    acceptances: [],
    flagAcceptances: [],
  });
  expect(d.ok).toBe(true);
  await handOverWithOverride(job);
  expect(await revisions(job)).toEqual([1]);
  const left = check.ops[0];
  return { job, left, closeSignOff: close.signOff.id };
}

describe("accepting a closed job's flagged entry that no sign-off can carry (real PostgreSQL)", () => {
  it("the late correction holds the report's revisions until the office accepts it in writing; then revision 2 prints it", async () => {
    const { job, left } = await closedWithUnsignedStage();
    const fix = job.tablet.read(job.steps["measure-gap"], job.specId, 0, 0.18, { supersedesId: left.id });
    expect((await sync(db, job.users.mech, job.tablet, [fix])).flagged.map((f) => f.id)).toEqual([fix.id]);
    const item = (await loadOpenItems(db, job.fx.shopId, job.workOrderId))!.find((i) => i.key === `flagged_not_accepted:${fix.id}`);
    expect(item).toMatchObject({ signOffId: null, stage: { key: "check" } });
    // listed for the supervisor's review page, under its job
    expect(await entriesToAcceptOnTheirOwn(db, job.fx.shopId, job.users.sup.id)).toEqual([
      {
        workOrderId: job.workOrderId,
        number: 2,
        title: "Close-out job",
        items: [expect.objectContaining({ key: `flagged_not_accepted:${fix.id}` })],
      },
    ]);

    // in workshop words: too short a reason; the mechanic's role may not accept
    const short = await accept(job, fix.id, { justification: "ok" }, job.users.office);
    expect(short.status).toBe(400);
    expect((await short.json()).issues).toEqual([
      { path: "justification", message: "Write at least 10 characters: why may this flagged entry stand?" },
    ]);
    expect((await accept(job, fix.id, { justification: "Remeasured at collection" }, job.users.mech)).status).toBe(403);
    expect(await revisions(job)).toEqual([1]);

    const ok = await accept(job, fix.id, { justification: "Remeasured at collection with the customer present" }, job.users.office);
    expect(ok.status).toBe(201);
    expect(await ok.json()).toMatchObject({ acceptanceId: expect.any(String), reportRevision: 2 });
    expect(await revisions(job)).toEqual([1, 2]);
    const rev2 = await db
      .selectFrom("report_revisions")
      .select("changes")
      .where("work_order_id", "=", job.workOrderId)
      .where("revision", "=", 2)
      .executeTakeFirstOrThrow();
    expect(rev2.changes).toContainEqual(
      expect.stringMatching(
        /^Added: Flagged entries: Reading: 0\.18 mm \(a correction\).*Accepted by .* on its own, with no sign-off to review: Remeasured at collection with the customer present/,
      ),
    );
    const row = await db.selectFrom("flag_acceptances").selectAll().where("operation_id", "=", fix.id).executeTakeFirstOrThrow();
    expect(row).toMatchObject({
      decision_id: null,
      accepted_by: job.users.office.id,
      justification: "Remeasured at collection with the customer present",
    });
    expect((await loadOpenItems(db, job.fx.shopId, job.workOrderId))!.map((i) => i.key)).not.toContain(`flagged_not_accepted:${fix.id}`);
    expect(await entriesToAcceptOnTheirOwn(db, job.fx.shopId, job.users.sup.id)).toEqual([]);
    expect(await auditOf(job.workOrderId)).toEqual([["accepted", null]]);

    // once only: a second acceptance is refused, and audited
    const again = await accept(job, fix.id, { justification: "Accepting it a second time" }, job.users.sup);
    expect(again.status).toBe(409);
    expect((await again.json()).error).toMatch(/no longer waiting/);
    expect(await auditOf(job.workOrderId)).toEqual([
      ["accepted", null],
      ["refused", expect.stringMatching(/no longer waiting/)],
    ]);
  });

  it("a sign-off withdrawn before an override handover: its stage's late entry is accepted on its own, not by the one who recorded it", async () => {
    const job = await closeOutJob(db);
    const check = stageWork(job, "check");
    await sync(db, job.users.mech, job.tablet, check.ops);
    await sync(db, job.users.mech, job.tablet, [
      job.tablet.make("entry.withdrawn", { operationId: check.signOff.id, reason: "Signed off too early" }),
    ]);
    await handOverWithOverride(job);

    // the supervisor completes the cover step again at the counter, on their own tablet
    const supTablet = new Tablet("tablet-sup-counter", job.users.sup.id, job.workOrderId);
    const redo = supTablet.complete(job.steps["fit-cover"]);
    expect((await sync(db, job.users.sup, supTablet, [redo])).flagged.map((f) => f.id)).toEqual([redo.id]);

    // the review page lists it for the office, not for the supervisor who recorded it
    expect(await entriesToAcceptOnTheirOwn(db, job.fx.shopId, job.users.sup.id)).toEqual([]);
    expect((await entriesToAcceptOnTheirOwn(db, job.fx.shopId, job.users.office.id)).map((j) => j.items.map((i) => i.key))).toEqual([
      [`flagged_not_accepted:${redo.id}`],
    ]);
    const own = await accept(job, redo.id, { justification: "Refitted the cover at the counter" }, job.users.sup);
    expect(own.status).toBe(422);
    expect((await own.json()).error).toMatch(/You recorded this entry yourself/);
    expect(await db.selectFrom("flag_acceptances").select("id").where("operation_id", "=", redo.id).execute()).toEqual([]);
    expect(await auditOf(job.workOrderId)).toEqual([["refused", expect.stringMatching(/You recorded this entry yourself/)]]);

    const ok = await accept(job, redo.id, { justification: "Cover refitted at collection; checked the seal" }, job.users.office);
    expect(ok.status).toBe(201);
    expect((await ok.json()).reportRevision).toBe(2);
  });

  it("an entry a sign-off can carry, and one on a job still open, are accepted with the supervisor's decision, not on their own", async () => {
    const { job } = await closedWithUnsignedStage();
    // the close stage is signed off and approved: its late entry goes back to that sign-off's review
    const reseal = job.tablet.complete(job.steps.seal);
    await sync(db, job.users.mech, job.tablet, [reseal]);
    expect(await entriesToAcceptOnTheirOwn(db, job.fx.shopId, job.users.sup.id)).toEqual([]); // in the review queue instead
    const viaReview = await accept(job, reseal.id, { justification: "Seal checked again at collection" }, job.users.office);
    expect(viaReview.status).toBe(409);
    expect((await viaReview.json()).error).toMatch(/decision on the sign-off of “Close up”/);

    // a job waiting for the customer's quote answer: bench work on it is kept and flagged, but the job is open
    const open = await closeOutJob(db, { status: "quoted" });
    const w = stageWork(open, "check");
    expect((await sync(db, open.users.mech, open.tablet, [w.ops[0]])).flagged.map((f) => f.id)).toEqual([w.ops[0].id]);
    const onOpen = await accept(open, w.ops[0].id, { justification: "Reading looks right to me" }, open.users.office);
    expect(onOpen.status).toBe(409);
    expect((await onOpen.json()).error).toMatch(/still open/);

    // nothing was accepted by any refusal, and each refusal is on the audit log
    expect(await db.selectFrom("flag_acceptances").select("id").where("operation_id", "in", [reseal.id, w.ops[0].id]).execute()).toEqual(
      [],
    );
    expect(await auditOf(job.workOrderId)).toEqual([["refused", expect.stringMatching(/decision on the sign-off of “Close up”/)]]);
    expect(await auditOf(open.workOrderId)).toEqual([["refused", expect.stringMatching(/still open/)]]);
  });

  it("on a cancelled job an entry is accepted on its own too, and no report revision is made (a cancelled job has no report)", async () => {
    const job = await closeOutJob(db, { status: "cancelled" });
    const w = stageWork(job, "check");
    expect((await sync(db, job.users.mech, job.tablet, [w.ops[0]])).flagged.map((f) => f.id)).toEqual([w.ops[0].id]);
    const ok = await accept(job, w.ops[0].id, { justification: "Measured before the customer cancelled; keep it" }, job.users.sup);
    expect(ok.status).toBe(201);
    expect((await ok.json()).reportRevision).toBeNull();
    expect(await revisions(job)).toEqual([]);
    expect(await auditOf(job.workOrderId)).toEqual([["accepted", null]]);
  });
});
