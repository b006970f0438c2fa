import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { POST as syncRoute } from "@/app/api/sync/route";
import type { Db } from "@/db/setup/client";
import type { SessionUser } from "@/lib/auth/session-user";
import { syncResponseSchema } from "@/lib/sync/changes";
import { SYNC_LIMITS } from "@/lib/sync/operations";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
const asUser = (u: ShopFixture["users"]["mechanic"], customerId: string | null = null): SessionUser => ({ ...u, customerId });

const post = (body: BodyInit | null, headers: Record<string, string> = {}) =>
  appRequest("/api/sync", { method: "POST", body, headers: { "content-type": "application/json", ...headers } });
// POST /api/sync through the route wrapper, with the user and database given.
const handleSyncRequest = (req: Request, user: SessionUser | null, db: Db) => syncRoute.handle(req, { user, db });

async function setup() {
  const fx = await createShopFixture(db);
  const specs = await fixtureSpecs(db, fx);
  const mech = asUser(fx.users.mechanic);
  return { fx, specs, mech, tablet: new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId) };
}

describe("POST /api/sync handler", () => {
  it("merges a good batch and answers in the documented shape", async () => {
    const { specs, mech, tablet } = await setup();
    const op = tablet.read(specs.boreStepId, specs.boreSpecId, 0, 76.004);
    const res = await handleSyncRequest(post(JSON.stringify(tablet.batch([op]))), mech, db);
    expect(res.status).toBe(200);
    const body = syncResponseSchema.parse(await res.json());
    expect(body.accepted).toEqual([op.id]);
    expect(Number(body.cursor)).toBeGreaterThan(0);
  });

  it("answers 401 when nobody is signed in", async () => {
    const res = await handleSyncRequest(post("{}"), null, db);
    expect(res.status).toBe(401);
    expect(await res.json()).toEqual({ error: "Sign in first.", issues: [] });
  });

  it("takes a session naming an id that is not a UUID as nobody (401), never a database error", async () => {
    const res = await syncRoute.handle(post("{}"), { userId: "42; not-an-id", db });
    expect([res.status, await res.json()]).toEqual([401, { error: "Sign in first.", issues: [] }]);
  });

  it("answers 403 to office and customer users", async () => {
    const { fx } = await setup();
    for (const [user, role] of [
      [asUser(fx.users.office), "office"],
      [asUser(fx.users.customer, fx.customerId), "customer"],
    ] as const) {
      const res = await handleSyncRequest(post(JSON.stringify({ deviceId: "x", cursor: null, operations: [] })), user, db);
      expect(res.status).toBe(403);
      expect((await res.json()).error).toContain(`(${role})`);
    }
  });

  it("answers 400 with the parser's reason for malformed JSON, and for an empty body", async () => {
    const { mech } = await setup();
    const res = await handleSyncRequest(post('{"deviceId": "tab-1", "operations": [,]}'), mech, db);
    expect(res.status).toBe(400);
    expect((await res.json()).error).toMatch(/^The body is not valid JSON: /);
    const empty = await handleSyncRequest(post(""), mech, db);
    expect(empty.status).toBe(400);
    expect((await empty.json()).error).toContain("The body is empty");
  });

  it("refuses a malformed operation alone, naming each problem in workshop words, and merges the rest", async () => {
    const { fx, specs, mech, tablet } = await setup();
    const good = tablet.complete(specs.boreStepId);
    const bad = {
      ...tablet.read(specs.boreStepId, specs.boreSpecId, 0, 76),
      payload: { stepId: specs.boreStepId, specId: specs.boreSpecId, readingIndex: 0, value: "76,01", unit: "cm" },
    };
    const res = await handleSyncRequest(
      post(JSON.stringify({ deviceId: tablet.deviceId, cursor: null, operations: [good, bad] })),
      mech,
      db,
    );
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.accepted).toEqual([good.id]);
    expect(body.refused).toEqual([
      {
        id: bad.id,
        reason: expect.stringMatching(
          /^Value: must be a plain decimal number as typed on the keypad, e\.g\. 0\.030; Unit: choose mm, in, µm or cc\. The server cannot store this entry as it is/,
        ),
      },
    ]);
    expect((await db.selectFrom("operations").select("id").where("work_order_id", "=", fx.workOrderId).execute()).map((o) => o.id)).toEqual(
      [good.id],
    );
    // the refused one is in the audit log, whole
    const audit = await db.selectFrom("audit_log").select(["outcome", "action", "detail"]).where("entity_id", "=", bad.id).execute();
    expect(audit).toEqual([{ outcome: "refused", action: "sync.measurement.recorded", detail: { operation: bad, malformed: true } }]);
  });

  it("answers 422 with each problem's path and message when the batch's envelope is wrong, saving nothing", async () => {
    const { fx, specs, mech, tablet } = await setup();
    const res = await handleSyncRequest(
      post(JSON.stringify({ deviceId: "tab 1!", cursor: 12, operations: [tablet.complete(specs.boreStepId)] })),
      mech,
      db,
    );
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.issues).toEqual(
      expect.arrayContaining([
        { path: "deviceId", message: expect.stringContaining("letters, digits") },
        { path: "cursor", message: "Sync position: must be text" },
      ]),
    );
    expect(await db.selectFrom("operations").select("id").where("work_order_id", "=", fx.workOrderId).execute()).toEqual([]);
  });

  it("answers 413 when Content-Length is over the limit, without reading on", async () => {
    const { mech } = await setup();
    const res = await handleSyncRequest(post("{}", { "content-length": String(SYNC_LIMITS.maxBodyBytes + 1) }), mech, db);
    expect(res.status).toBe(413);
    expect((await res.json()).error).toContain(`the limit is ${SYNC_LIMITS.maxBodyBytes} bytes`);
  });

  it("answers 413 when the body itself is over the limit, whatever the headers say", async () => {
    const { mech } = await setup();
    const big = new TextEncoder().encode(
      JSON.stringify({ deviceId: "tab-1", cursor: null, operations: [], pad: "x".repeat(SYNC_LIMITS.maxBodyBytes) }),
    );
    // streamed in chunks with no Content-Length
    const stream = new ReadableStream<Uint8Array>({
      start(c) {
        for (let i = 0; i < big.byteLength; i += 1 << 20) c.enqueue(big.subarray(i, i + (1 << 20)));
        c.close();
      },
    });
    const res = await handleSyncRequest(post(stream), mech, db);
    expect(res.status).toBe(413);
    expect((await res.json()).error).toContain("over");
  });

  it("answers 413 for more operations than a batch may hold", async () => {
    const { specs, mech, tablet } = await setup();
    const one = tablet.complete(specs.boreStepId);
    const ops = Array.from({ length: SYNC_LIMITS.maxOperations + 1 }, () => one);
    const res = await handleSyncRequest(post(JSON.stringify(tablet.batch(ops))), mech, db);
    expect(res.status).toBe(413);
    expect((await res.json()).error).toBe(
      `The batch has ${SYNC_LIMITS.maxOperations + 1} operations; the limit is ${SYNC_LIMITS.maxOperations}. Send the outbox in smaller batches.`,
    );
  });
});
