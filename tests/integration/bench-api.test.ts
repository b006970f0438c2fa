import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { GET as jobSnapshot } from "@/app/api/bench/jobs/[id]/route";
import { GET as benchJobs } from "@/app/api/bench/jobs/route";
import { GET as tagLookup } from "@/app/api/bench/tags/[code]/route";
import type { Db } from "@/db/setup/client";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { bottomEndTemplate } from "@/lib/procedures/demo-templates/bottom-end";
import type { WorkOrderStatus } from "@/lib/work-orders/status";
import { benchJobListSchema, jobSnapshotSchema, tagLookupSchema } from "@/lib/sync/snapshot";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
// The three bench read routes, called through the route wrapper with the user and database given.
const benchJobsResponse = (user: SessionUser | null, db: Db) => benchJobs.handle(appRequest("/api/bench/jobs"), { user, db });
const jobSnapshotResponse = (user: SessionUser | null, db: Db, id: string) =>
  jobSnapshot.handle(appRequest(`/api/bench/jobs/${id}`), { user, db, params: { id } });
const tagLookupResponse = (user: SessionUser | null, db: Db, code: string) =>
  tagLookup.handle(appRequest(`/api/bench/tags/${encodeURIComponent(code)}`), { user, db, params: { code } });
const asUser = (u: ShopFixture["users"]["mechanic"], customerId: string | null = null): SessionUser => ({ ...u, customerId });

async function addJob(fx: ShopFixture, number: number, status: WorkOrderStatus, mechanicId: string | null) {
  const bike = await db
    .insertInto("bikes")
    .values({
      shop_id: fx.shopId,
      customer_id: fx.customerId,
      make: "Invented",
      model: `Model ${number}`,
      year: 2018,
      tag_code: `T-${randomUUID().slice(0, 8)}`,
      vin: null,
      engine_number: null,
      displacement_cc: 749,
      colour: "green",
    })
    .returning(["id", "tag_code"])
    .executeTakeFirstOrThrow();
  const wo = await db
    .insertInto("work_orders")
    .values({
      shop_id: fx.shopId,
      bike_id: bike.id,
      number,
      title: `Job ${number}`,
      status,
      intake_odometer_km: 10,
      assigned_mechanic_id: mechanicId,
      closed_at: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return { id: wo.id, tag: bike.tag_code };
}

describe("GET /api/bench/jobs", () => {
  it("lists the shop's jobs open for bench work, mine first, then unassigned, then others'", async () => {
    const fx = await createShopFixture(db);
    const mech = asUser(fx.users.mechanic);
    const others = await addJob(fx, 2, "in_review", fx.users.mechanic2.id);
    const unassigned = await addJob(fx, 3, "on_dyno", null);
    await addJob(fx, 4, "quoted", mech.id);
    await addJob(fx, 5, "handed_over", mech.id);
    const mine = await addJob(fx, 6, "in_build", mech.id);
    await createShopFixture(db); // another shop's job must not show

    const res = await benchJobsResponse(mech, db);
    expect(res.status).toBe(200);
    const { jobs } = benchJobListSchema.parse(await res.json());
    expect(jobs.map((j) => j.id)).toEqual([fx.workOrderId, mine.id, unassigned.id, others.id]);
    expect(jobs[0]).toMatchObject({
      number: 1,
      assignedToMe: true,
      mayWork: true,
      statusLabel: "In build",
      bike: { tagCode: fx.bike.tag_code, model: "Test 1000" },
    });
    expect(jobs[2]).toMatchObject({ assignedMechanic: null, mayWork: true });
    expect(jobs[3]).toMatchObject({ assignedToMe: false, mayWork: false, assignedMechanic: { id: fx.users.mechanic2.id } });
  });

  it("refuses without a user (401) and for office or customer roles (403)", async () => {
    const fx = await createShopFixture(db);
    expect((await benchJobsResponse(null, db)).status).toBe(401);
    expect((await benchJobsResponse(asUser(fx.users.office), db)).status).toBe(403);
    expect((await jobSnapshotResponse(asUser(fx.users.customer, fx.customerId), db, fx.workOrderId)).status).toBe(403);
    expect((await tagLookupResponse(null, db, fx.bike.tag_code)).status).toBe(401);
  });
});

describe("GET /api/bench/jobs/[id]", () => {
  it("returns the pinned procedures and the recorded work, superseded readings included", async () => {
    const fx = await createShopFixture(db);
    const specs = await fixtureSpecs(db, fx);
    const mech = asUser(fx.users.mechanic);
    const t = new Tablet("bay-1", mech.id, fx.workOrderId);
    const first = t.read(specs.boreStepId, specs.boreSpecId, 0, 67.001);
    const fix = t.read(specs.boreStepId, specs.boreSpecId, 0, 76.001, { supersedesId: first.id });
    const signOff = t.make("stage.signed-off", specs.measureStage);
    const done = t.complete(specs.boreStepId);
    const bolt = t.bolt(specs.rodStepId, specs.rodSpecId, 1, 2);
    const merged = await mergeBatch(db, mech, t.batch([first, fix, done, bolt, signOff]));
    await db
      .insertInto("review_decisions")
      .values({
        sign_off_id: signOff.id,
        decision: "sent_back",
        reason: "Photo missing",
        reopened_step_ids: [specs.boreStepId],
        decided_by: fx.users.supervisor.id,
      })
      .execute();

    const res = await jobSnapshotResponse(mech, db, fx.workOrderId);
    expect(res.status).toBe(200);
    const snap = jobSnapshotSchema.parse(await res.json());
    expect(snap.workOrder).toMatchObject({
      id: fx.workOrderId,
      status: "in_build",
      openForBenchWork: true,
      assignedToMe: true,
      mayWork: true,
    });
    expect(snap.bike.tagCode).toBe(fx.bike.tag_code);

    // the procedures as pinned: stages and steps in the template's order, with specs and cautions
    expect(snap.procedures.map((p) => p.templateKey)).toEqual(["bottom-end-assembly", "cylinder-head-installation"]);
    const bottom = snap.procedures[0];
    expect(bottom.stages.map((s) => s.key)).toEqual(bottomEndTemplate.stages.map((s) => s.key));
    expect(bottom.stages[0].steps.map((s) => s.key)).toEqual(bottomEndTemplate.stages[0].steps.map((s) => s.key));
    const boreStep = bottom.stages[0].steps[0];
    const boreDoc = bottomEndTemplate.stages[0].steps[0];
    expect(boreStep.cautions).toEqual(boreDoc.cautions);
    expect(boreStep.measurementSpecs[0]).toMatchObject({
      min: boreDoc.measurements![0].min,
      max: boreDoc.measurements![0].max,
      readingLabels: boreDoc.measurements![0].readingLabels,
    });
    const rodDoc = bottomEndTemplate.stages[1].steps[0].torque![0];
    expect(bottom.stages[1].steps[0].torqueSpecs[0]).toMatchObject({
      finalValue: rodDoc.finalValue,
      passes: rodDoc.passes,
      anglePasses: rodDoc.anglePasses,
      torqueToYield: true,
    });
    // the cure starts once the cases are closed and torqued (within the sealant's working time) and holds the oil fill
    expect(bottom.stages[1].steps.find((s) => s.key === "case-sealant")!.timerSpecs).toEqual([]);
    expect(bottom.stages[1].steps.find((s) => s.key === "case-bolts")!.timerSpecs[0]).toMatchObject({
      durationS: 1800,
      blocksStepKey: "oil-prime",
    });

    // the recorded work
    expect(snap.state.readings.map((r) => [r.id, r.value, r.current, r.supersedesId])).toEqual([
      [first.id, 67.001, false, null],
      [fix.id, 76.001, true, first.id],
    ]);
    expect(snap.state.completions.map((c) => c.id)).toEqual([done.id]);
    expect(snap.state.torqueRecords).toEqual([expect.objectContaining({ id: bolt.id, passIndex: 1, bolt: 2 })]);
    expect(snap.state.signOffs.map((s) => s.id)).toEqual([signOff.id]);
    expect(snap.state.reviewDecisions).toEqual([
      expect.objectContaining({
        signOffId: signOff.id,
        decision: "sent_back",
        reason: "Photo missing",
        reopenedStepIds: [specs.boreStepId],
      }),
    ]);
    expect(Number(snap.cursor)).toBeGreaterThan(Number(merged.cursor));
    expect(snap.people.map((p) => p.id).sort()).toEqual([fx.users.mechanic.id, fx.users.mechanic2.id, fx.users.supervisor.id].sort());
  });

  it("answers 404 for another shop's job and 400 for a malformed id", async () => {
    const fx = await createShopFixture(db);
    const other = await createShopFixture(db);
    const res = await jobSnapshotResponse(asUser(fx.users.mechanic), db, other.workOrderId);
    expect(res.status).toBe(404);
    expect(await res.json()).toEqual({ error: `No work order ${other.workOrderId} in this shop.`, issues: [] });
    expect((await jobSnapshotResponse(asUser(fx.users.mechanic), db, "42")).status).toBe(400);
  });
});

describe("GET /api/bench/tags/[code]", () => {
  it("finds the bike's job open for bench work", async () => {
    const fx = await createShopFixture(db);
    const res = await tagLookupResponse(asUser(fx.users.mechanic2), db, fx.bike.tag_code);
    expect(res.status).toBe(200);
    expect(tagLookupSchema.parse(await res.json())).toEqual({
      workOrderId: fx.workOrderId,
      number: 1,
      bike: { id: fx.bike.id, tagCode: fx.bike.tag_code, make: "Fixture", model: "Test 1000" },
    });
  });

  it("says which is missing: the bike, or an open job", async () => {
    const fx = await createShopFixture(db);
    const other = await createShopFixture(db);
    const user = asUser(fx.users.mechanic);
    const noBike = await tagLookupResponse(user, db, other.bike.tag_code);
    expect(noBike.status).toBe(404);
    expect(await noBike.json()).toEqual({ error: `No bike with tag ${other.bike.tag_code} in this shop.`, issues: [] });
    const idle = await addJob(fx, 7, "ready", null);
    const noJob = await tagLookupResponse(user, db, idle.tag);
    expect(noJob.status).toBe(404);
    expect(await noJob.json()).toEqual({ error: `Bike ${idle.tag} has no open job.`, issues: [] });
    expect((await tagLookupResponse(user, db, "x".repeat(65))).status).toBe(400);
  });
});
