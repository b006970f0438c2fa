import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { POST as discardRoute } from "@/app/api/sync/discards/route";
import { POST as syncRoute } from "@/app/api/sync/route";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { createShopFixture } from "./support/shop-fixture";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

// A tablet lets go of a refused (or held) entry only after the server has written down what it
// was, why it was refused and why the person discards it: POST /api/sync/discards.

const db = useTestDb();

const post = (path: string, body: unknown) =>
  appRequest(path, {
    method: "POST",
    body: typeof body === "string" ? body : JSON.stringify(body),
    headers: { "content-type": "application/json" },
  });

async function setup() {
  const fx = await createShopFixture(db);
  const specs = await fixtureSpecs(db, fx);
  const mech: SessionUser = { ...fx.users.mechanic, customerId: null };
  return { fx, specs, mech, tablet: new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId) };
}

const discardsOf = (id: string) =>
  db
    .selectFrom("audit_log")
    .select(["actor_id", "device_id", "action", "outcome", "reason", "work_order_id", "detail"])
    .where("entity_id", "=", id)
    .where("action", "=", "sync.discarded")
    .execute();

describe("discarding a refused entry", () => {
  it("writes down a malformed entry (a NUL in its note) with the refusal and the person's reason, once", async () => {
    const { fx, specs, mech, tablet } = await setup();
    const bad = tablet.read(specs.boreStepId, specs.boreSpecId, 0, 76.004, { note: "taken warm\u0000" });
    const good = tablet.complete(specs.boreStepId);
    // the raw body carries the NUL as JSON's \u0000 escape, as a tablet's JSON.stringify writes it
    const res = await syncRoute.handle(post("/api/sync", tablet.batch([bad, good])), { user: mech, db });
    const answer = await res.json();
    expect(res.status).toBe(200);
    expect(answer.accepted).toEqual([good.id]);
    expect(answer.refused).toEqual([{ id: bad.id, reason: expect.stringContaining("Note holds a NUL character") }]);

    const discard = {
      id: bad.id,
      operation: bad,
      refusedReason: answer.refused[0].reason,
      reason: "Typed again without the stray character",
    };
    for (let i = 0; i < 2; i++) {
      const out = await discardRoute.handle(post("/api/sync/discards", { deviceId: tablet.deviceId, discards: [discard] }), {
        user: mech,
        db,
      });
      expect([out.status, await out.json()]).toEqual([200, { results: [{ id: bad.id, outcome: "discarded" }] }]);
    }
    const rows = await discardsOf(bad.id);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      actor_id: mech.id,
      device_id: tablet.deviceId,
      outcome: "accepted",
      reason: "Typed again without the stray character",
      work_order_id: fx.workOrderId,
    });
    const detail = rows[0].detail as { operation: { payload: { note: string } }; refusedReason: string; wasHeld: boolean; kind: string };
    expect(detail.operation.payload.note).toBe("taken warm\\u0000"); // stored, and shown for what it was
    expect(detail).toMatchObject({ kind: "measurement.recorded", wasHeld: false, refusedReason: answer.refused[0].reason });
  });

  it("marks a held entry discarded, so it is never applied when its record arrives", async () => {
    const { specs, mech, tablet } = await setup();
    const reading = tablet.read(specs.boreStepId, specs.boreSpecId, 1, 76.004);
    const correction = tablet.read(specs.boreStepId, specs.boreSpecId, 1, 76.006, { supersedesId: reading.id });
    const held = await mergeBatch(db, mech, tablet.batch([correction]));
    expect(held.pending.map((p) => p.id)).toEqual([correction.id]);

    const out = await discardRoute.handle(
      post("/api/sync/discards", {
        deviceId: tablet.deviceId,
        discards: [{ id: correction.id, operation: correction, refusedReason: held.pending[0].reason, reason: "Wrong cylinder" }],
      }),
      { user: mech, db },
    );
    expect((await out.json()).results).toEqual([{ id: correction.id, outcome: "discarded" }]);
    expect(await mergeBatch(db, mech, tablet.batch([reading]))).toMatchObject({ accepted: [reading.id] });
    expect(await db.selectFrom("measurements").select("id").where("id", "=", correction.id).execute()).toEqual([]);
    const row = await db
      .selectFrom("sync_pending_operations")
      .select("resolution")
      .where("id", "=", correction.id)
      .executeTakeFirstOrThrow();
    expect(row.resolution).toBe("discarded");
    expect((await discardsOf(correction.id))[0].detail).toMatchObject({ wasHeld: true });
  });

  it("does not discard recorded work: an entry the server stored is answered 'stored', nothing written", async () => {
    const { specs, mech, tablet } = await setup();
    const op = tablet.complete(specs.boreStepId);
    await mergeBatch(db, mech, tablet.batch([op]));
    const out = await discardRoute.handle(
      post("/api/sync/discards", {
        deviceId: tablet.deviceId,
        discards: [{ id: op.id, operation: op, refusedReason: "", reason: "oops" }],
      }),
      { user: mech, db },
    );
    expect((await out.json()).results).toEqual([{ id: op.id, outcome: "stored" }]);
    expect(await discardsOf(op.id)).toEqual([]);
  });

  it("asks for a reason in workshop words, and is for bench users only", async () => {
    const { fx, mech, tablet } = await setup();
    const body = { deviceId: tablet.deviceId, discards: [{ id: randomUUID(), operation: {}, refusedReason: "", reason: " x " }] };
    const res = await discardRoute.handle(post("/api/sync/discards", body), { user: mech, db });
    expect(res.status).toBe(400);
    expect((await res.json()).issues).toEqual([{ path: "discards.0.reason", message: "say in a few words why it goes" }]);
    const office = await discardRoute.handle(post("/api/sync/discards", body), { user: { ...fx.users.office, customerId: null }, db });
    expect(office.status).toBe(403);
  });
});
