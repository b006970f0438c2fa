import { describe, expect, it } from "vitest";
import { queueReviewNotices } from "@/app/_server/review-mail";
import { decideOnSignOff } from "@/db/review/decide";
import { decisionInputSchema } from "@/lib/review/decision-input";
import { Tablet } from "../bench/sync-ops";
import { mailTo, useFakes } from "./support/fakes";
import { eventually, useQueueWorkers, withSmtpRefusing } from "./support/queue";
import { measureStageWork, reviewSetup, sync } from "./support/review-bench";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
const ports = useFakes();
useQueueWorkers(db);
const notice = (signOffId: string) =>
  db.selectFrom("review_notices").selectAll().where("sign_off_id", "=", signOffId).executeTakeFirstOrThrow();

describe("supervisor e-mail when a stage with readings out of tolerance is signed off", () => {
  it("the merge leaves the intent; a queue job turns it into the supervisor's e-mail, sent through SMTP (maildev) once", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const tablet = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage, { "top-ring-gap:3": 0.31 });
    await sync(db, users.mech, tablet, ops);
    // Stored by the merge's own transaction, before any e-mail is tried.
    expect(await notice(signOff.id)).toMatchObject({ state: "waiting", attempts: 0, shop_id: fx.shopId });

    const run = await queueReviewNotices(db);
    expect(run.queued).toBeGreaterThanOrEqual(1);
    // the queue worker sends it in the background
    await eventually(async () => (await mailTo(ports.mailWeb, users.sup.email)).length > 0, 60_000);
    const mails = await mailTo(ports.mailWeb, users.sup.email);
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toBe('Work order 1: "Measure before assembly" signed off with 1 reading out of tolerance');
    expect(mails[0].text).toContain(
      `${users.mech.name} signed off "Measure before assembly" on work order 1 (Fixture Test 1000, tag ${fx.bike.tag_code})`,
    );
    expect(mails[0].text).toContain("Top ring end gap — Top ring gap, Cyl 4: 0.31 mm (low; limits 0.35–0.48 mm)");
    expect(mails[0].text).toContain(`/review/${signOff.id}`);
    // Only supervisors are written to while there is one; never the mechanic.
    expect(await mailTo(ports.mailWeb, users.office.email, 0, 0)).toEqual([]);
    expect(await notice(signOff.id)).toMatchObject({ state: "sent", attempts: 1, last_error: null });

    const sent = () => db.selectFrom("outbound_emails").select("id").where("work_order_id", "=", fx.workOrderId).execute();
    await eventually(async () => (await sent()).length > 0);
    const recorded = await db.selectFrom("outbound_emails").selectAll().where("work_order_id", "=", fx.workOrderId).execute();
    expect(recorded).toEqual([expect.objectContaining({ kind: "review_needed", recipient: users.sup.email, error: null })]);
    const audit = await db
      .selectFrom("audit_log")
      .selectAll()
      .where("work_order_id", "=", fx.workOrderId)
      .where("action", "=", "review.notice-mail")
      .execute();
    expect(audit).toEqual([expect.objectContaining({ outcome: "accepted", entity_id: signOff.id })]);

    // A later run sends nothing again.
    await queueReviewNotices(db);
    expect(await mailTo(ports.mailWeb, users.sup.email, 2, 300)).toHaveLength(1);
  }, 120_000); // the queue works in the background: generous on a loaded machine

  it("no e-mail for a stage whose readings are all in tolerance, or one already decided", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const tablet = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    const clean = measureStageWork(tablet, specs, stepIds, stage);
    await sync(db, users.mech, tablet, clean.ops);
    await queueReviewNotices(db);
    expect(await notice(clean.signOff.id)).toMatchObject({ state: "not_needed" });

    // Out of tolerance, but the office decided before the e-mail went out.
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage, { "bore-1:5": 75.99 });
    await sync(db, users.mech, tablet, ops);
    await decideOnSignOff(
      db,
      users.office,
      signOff.id,
      decisionInputSchema.parse({
        decision: "sent_back",
        expectedDecisionId: null,
        reason: "Bore 1 below the limit at the bottom",
        reopenStepIds: [stepIds[0]],
      }),
    );
    await queueReviewNotices(db);
    expect(await notice(signOff.id)).toMatchObject({ state: "not_needed" });
    expect(await mailTo(ports.mailWeb, users.sup.email, 1, 300)).toEqual([]);
  });

  it("when SMTP is down the notice is still queued, and its e-mail goes out once SMTP answers again", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const tablet = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage, { "ptw-2:0": 0.09 });
    await sync(db, users.mech, tablet, ops);
    const sends = () => db.selectFrom("outbound_emails").select(["error"]).where("work_order_id", "=", fx.workOrderId).execute();
    await withSmtpRefusing(async () => {
      expect((await queueReviewNotices(db)).queued).toBeGreaterThanOrEqual(1);
      await eventually(async () => (await sends()).length > 0, 60_000);
    });
    expect(await notice(signOff.id)).toMatchObject({ state: "sent", attempts: 1, last_error: null });
    expect((await sends())[0].error).toMatch(/ECONNREFUSED|connect/i);
    // SMTP answers again: the retry (after its back-off) delivers it
    await eventually(async () => (await sends()).some((s) => s.error === null), 60_000);
    const mails = await mailTo(ports.mailWeb, users.sup.email);
    expect(mails.map((m) => m.subject)).toEqual(['Work order 1: "Measure before assembly" signed off with 1 reading out of tolerance']);
    expect(mails[0].text).toContain("Piston-to-wall, cyl 2: 0.09 mm (high; limits 0.05–0.075 mm)");
  }, 120_000); // the queue works in the background: generous on a loaded machine
});
