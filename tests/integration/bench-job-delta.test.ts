import { describe, expect, it } from "vitest";
import { GET as jobCopy } from "@/app/api/bench/jobs/[id]/route";
import { decideOnSignOff } from "@/db/review/decide";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { decisionInputSchema } from "@/lib/review/decision-input";
import { jobSnapshotSchema, type JobSnapshot } from "@/lib/sync/snapshot";
import { applySnapshotDelta, sectionDigests, snapshotDeltaSchema, snapshotDigest } from "@/lib/sync/snapshot-delta";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { appRequest } from "./support/route-calls";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// A tablet holding a copy of a job fetches only what changed (lib/sync/snapshot-delta.ts): "unchanged"
// when nothing did, else a delta which, applied to the held copy, gives exactly the record's copy.

const db = useTestDb();
const asUser = (u: ShopFixture["users"]["mechanic"]): SessionUser => ({ ...u, customerId: null });

/** GET the job's copy as a tablet holding `held` asks for it (no copy held: the plain request). */
async function fetchAs(user: SessionUser, id: string, held?: JobSnapshot, headers: Record<string, string> = {}) {
  if (held) {
    const have = await sectionDigests(held);
    headers = {
      "x-bench-since": held.cursor,
      "x-bench-have": have.join("."),
      ...headers,
    };
  }
  const res = await jobCopy.handle(appRequest(`/api/bench/jobs/${id}`, { headers }), { user, db, params: { id } });
  const text = await res.text();
  return { res, text, body: JSON.parse(text) as unknown, bytes: new TextEncoder().encode(text).byteLength };
}

async function whole(user: SessionUser, id: string) {
  const r = await fetchAs(user, id);
  expect(r.res.status).toBe(200);
  return { copy: jobSnapshotSchema.parse(r.body), etag: r.res.headers.get("etag"), bytes: r.bytes };
}

describe("a job's copy, only what changed", () => {
  it("unchanged when nothing in the job changed; after readings, a correction, bolts, a timer, a withdrawal, a sign-off and a decision, the delta gives the record's copy", async () => {
    const fx = await createShopFixture(db);
    const specs = await fixtureSpecs(db, fx);
    const mech = asUser(fx.users.mechanic);
    const sup = asUser(fx.users.supervisor);
    const bay1 = new Tablet("bay-1", mech.id, fx.workOrderId);
    const first = bay1.read(specs.boreStepId, specs.boreSpecId, 0, 76.004);
    const work = [
      first,
      ...Array.from({ length: 30 }, (_, i) => bay1.bolt(specs.caseBoltsStepId, specs.caseBoltsSpecId, 1 + (i % 3), 1 + (i % 10))),
    ];
    await mergeBatch(db, mech, bay1.batch(work));

    const held = await whole(mech, fx.workOrderId);
    // the ETag is the digest of the copy as the tablet parsed and stored it
    expect(held.etag).toBe(`"${await snapshotDigest(await sectionDigests(held.copy))}"`);

    // nothing changed in the job (work on another job of the shop moves the cursor only)
    const again = await fetchAs(mech, fx.workOrderId, held.copy);
    expect(again.res.status).toBe(200);
    expect(again.body).toEqual({ cursor: held.copy.cursor, unchanged: true });

    // another tablet: a correction of the first reading (which stops being current), new readings,
    // a completion, a timer started and stopped, a bolt withdrawn, a sign-off; then a send-back
    const bay2 = new Tablet("bay-2", mech.id, fx.workOrderId);
    const fix = bay2.read(specs.boreStepId, specs.boreSpecId, 0, 76.006, { supersedesId: first.id });
    const timerId = crypto.randomUUID();
    const signOff = bay2.make("stage.signed-off", specs.measureStage);
    const later = [
      fix,
      bay2.read(specs.boreStepId, specs.boreSpecId, 1, 76.005),
      bay2.complete(specs.boreStepId),
      bay2.make("timer.started", {
        timerId,
        stepId: specs.cureStepId,
        timerSpecId: specs.cureTimerSpecId,
        label: "Sealant cure",
        durationS: 600,
        startedAt: new Date().toISOString(),
      }),
      bay2.make("timer.stopped", { timerId, stoppedAt: new Date().toISOString() }),
      bay2.make("entry.withdrawn", { operationId: work[3].id, reason: "Wrong bolt marked" }),
      signOff,
    ];
    const merged = await mergeBatch(db, mech, bay2.batch(later));
    expect(merged.refused).toEqual([]);
    const sent = await decideOnSignOff(
      db,
      sup,
      signOff.id,
      decisionInputSchema.parse({
        decision: "sent_back",
        expectedDecisionId: null,
        reason: "Bore cylinder 1 again",
        reopenStepIds: [specs.boreStepId],
      }),
    );
    expect(sent.ok).toBe(true);

    const record = await whole(mech, fx.workOrderId);
    const d = await fetchAs(mech, fx.workOrderId, held.copy);
    expect(d.res.status).toBe(200);
    expect(d.res.headers.get("etag")).toBe(record.etag);
    expect((d.body as { cursor: string }).cursor).toBe(record.copy.cursor);
    const delta = snapshotDeltaSchema.parse(d.body).delta;
    // only the new entries of the growing lists come, and the reading's spot whose current one changed
    expect(delta.rows.torqueRecords ?? []).toEqual([]);
    expect(delta.rows.readings!.map((r) => r.row.id).sort()).toEqual([first.id, fix.id, later[1].id].sort());
    expect(delta.rows.withdrawals!.map((r) => r.row.id)).toEqual([later[5].id]);
    expect(delta.rows.reviewDecisions!.map((r) => r.row.signOffId)).toEqual([signOff.id]);
    expect(Object.keys(delta.replace)).toEqual(["timers"]);
    expect(d.bytes).toBeLessThan(record.bytes / 3);

    const applied = jobSnapshotSchema.parse(applySnapshotDelta(held.copy, delta));
    expect(applied).toEqual(record.copy);
    expect(await snapshotDigest(await sectionDigests(applied))).toBe(delta.digest);
  });

  it("a change the office makes (another mechanic assigned) comes as its section; headers that do not read get the whole copy", async () => {
    const fx = await createShopFixture(db);
    const sup = asUser(fx.users.supervisor);
    const held = await whole(sup, fx.workOrderId);
    await db.updateTable("work_orders").set({ assigned_mechanic_id: fx.users.mechanic2.id }).where("id", "=", fx.workOrderId).execute();
    const d = await fetchAs(sup, fx.workOrderId, held.copy);
    const delta = snapshotDeltaSchema.parse(d.body).delta;
    expect(Object.keys(delta.replace)).toEqual(["workOrder"]);
    expect(jobSnapshotSchema.parse(applySnapshotDelta(held.copy, delta))).toEqual((await whole(sup, fx.workOrderId)).copy);

    for (const bad of [
      { "x-bench-since": "12abc", "x-bench-have": "x" },
      { "x-bench-since": "1", "x-bench-have": "0".repeat(16) },
      { "x-bench-since": "99999999999999999", "x-bench-have": Array(14).fill("0123456789abcdef").join(".") },
    ]) {
      const r = await fetchAs(sup, fx.workOrderId, undefined, bad);
      expect(r.res.status).toBe(200);
      expect(jobSnapshotSchema.parse(r.body).workOrder.id).toBe(fx.workOrderId);
    }
  });
});
