import { sql } from "kysely";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as listCustomers, POST as createCustomer } from "@/app/api/office/customers/route";
import { POST as bookIn } from "@/app/api/office/work-orders/route";
import { MAX_HANDOVERS_PER_SESSION, recordOutboxHandover } from "@/db/auth/outbox-handovers";
import { startSession } from "@/db/auth/sessions";
import type { SessionUser } from "@/lib/auth/session-user";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

// A text PostgreSQL cannot store (a NUL, another control character, half of an emoji) is answered
// with the field and what to do, never as a server error after the database refused the write;
// and nothing is saved. Where a route keeps what a tablet held whatever it holds (an ended
// session's hand-over), it is kept as a copy the database accepts. (Every route is held to the
// first rule by tests/unit/routes/every-route-is-wrapped.test.ts, without a database.)

const db = useTestDb();
let fx: ShopFixture;
let office: SessionUser;

beforeAll(async () => {
  fx = await createShopFixture(db);
  office = { ...fx.users.office, customerId: null };
});

const customersOfShop = async () =>
  (await sql<{ n: number }>`SELECT count(*)::int AS n FROM customers WHERE shop_id = ${fx.shopId}::uuid`.execute(db)).rows[0].n;

function postCustomer(body: Record<string, unknown>) {
  return createCustomer.handle(
    appRequest("/api/office/customers", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) }),
    { user: office, db },
  );
}

describe("texts the database cannot store", () => {
  it("refuses a customer whose name or notes hold one, naming the field, and saves nothing", async () => {
    const before = await customersOfShop();
    const cases: Array<[Record<string, unknown>, { path: string; message: string }[]]> = [
      [{ name: "Ada\u0000 Brook" }, [{ path: "name", message: "Name holds a NUL character, which cannot be stored: retype it." }]],
      [
        { name: "Ada Brook \ud83d", notes: "bell\u0007" },
        [
          { path: "name", message: "Name holds a broken character (half of an emoji or symbol): retype it." },
          { path: "notes", message: "Notes holds a control character, which cannot be stored: retype it." },
        ],
      ],
    ];
    for (const [body, issues] of cases) {
      const res = await postCustomer(body);
      expect(res.status).toBe(400);
      expect((await res.json()).issues).toEqual(issues);
    }
    expect(await customersOfShop()).toBe(before);
    // the same customer typed cleanly is saved: emoji whole, line breaks in the notes
    const ok = await postCustomer({ name: "Ada Brook 🏍", notes: "rings after five\nback door" });
    expect(ok.status).toBe(201);
    expect(await customersOfShop()).toBe(before + 1);
  });

  it("refuses a search holding one", async () => {
    const res = await listCustomers.handle(appRequest("/api/office/customers?q=br%00ook"), { user: office, db });
    expect(res.status).toBe(400);
    expect((await res.json()).issues).toEqual([{ path: "q", message: "Search holds a NUL character, which cannot be stored: retype it." }]);
  });

  it("refuses a booking-in form whose complaint holds one, and books nothing in", async () => {
    const count = async () =>
      (await sql<{ n: number }>`SELECT count(*)::int AS n FROM work_orders WHERE shop_id = ${fx.shopId}::uuid`.execute(db)).rows[0].n;
    const before = await count();
    const form = new FormData();
    form.set("bikeId", fx.bike.id);
    form.set("title", "Top-end refresh");
    form.set("complaint", "Rattle at idle\u0000");
    const res = await bookIn.handle(appRequest("/api/office/work-orders", { method: "POST", body: form }), { user: office, db });
    expect(res.status).toBe(400);
    expect((await res.json()).issues).toEqual([
      { path: "complaint", message: "Complaint or goal holds a NUL character, which cannot be stored: retype it." },
    ]);
    expect(await count()).toBe(before);
  });

  it("keeps an ended session's hand-over whatever its entries hold, as a copy the database accepts", async () => {
    const sessionId = await startSession(db, fx.users.mechanic, { address: "127.0.0.1", userAgent: "unstorable-text" });
    const entries = [
      { id: "a", op: { payload: { note: "shim\u0000 0.30" } } },
      { id: "b", op: { payload: { note: "half \ud83d an emoji" } } },
      { id: "c", op: { payload: { note: "clean" } } },
    ];
    const made = await recordOutboxHandover(db, {
      shopId: fx.shopId,
      userId: fx.users.mechanic.id,
      sessionId,
      deviceId: "tablet-unstorable",
      entries,
      photosLeft: [{ id: "p", stepId: "s", byteSize: 1, caption: "cap\u0000" }],
    });
    const row = await db
      .selectFrom("outbox_handovers")
      .select(["entry_count", "entries", "photos_left"])
      .where("id", "=", made.id)
      .executeTakeFirstOrThrow();
    expect(row.entry_count).toBe(3);
    expect(row.entries).toEqual([
      { id: "a", op: { payload: { note: "shim\\u0000 0.30" } } },
      { id: "b", op: { payload: { note: "half \\ud83d an emoji" } } },
      { id: "c", op: { payload: { note: "clean" } } },
    ]);
    expect(row.photos_left).toEqual([{ id: "p", stepId: "s", byteSize: 1, caption: "cap\\u0000" }]);
  });
});

describe("an ended session's hand-overs", () => {
  it("are kept a few times over, not without end, and only from the tablet the session was on", async () => {
    const fx = await createShopFixture(db);
    const sessionId = await startSession(db, fx.users.mechanic, { address: "127.0.0.1", userAgent: "handover-cap" });
    const handOver = (deviceId: string, sessionDeviceId: string | null = "tablet-cap") =>
      recordOutboxHandover(db, {
        shopId: fx.shopId,
        userId: fx.users.mechanic.id,
        sessionId,
        sessionDeviceId,
        deviceId,
        entries: [{ id: "a" }],
        photosLeft: [],
      });
    await expect(handOver("some-other-tablet")).rejects.toMatchObject({ status: 403 });
    for (let i = 0; i < MAX_HANDOVERS_PER_SESSION; i++) await handOver("tablet-cap");
    await expect(handOver("tablet-cap")).rejects.toMatchObject({
      status: 409,
      message: expect.stringMatching(/^This tablet has handed its work over 10 times already/),
    });
    // at once, past the cap: none more
    await Promise.allSettled(Array.from({ length: 4 }, () => handOver("tablet-cap")));
    const kept = await db.selectFrom("outbox_handovers").select("id").where("session_id", "=", sessionId).execute();
    expect(kept).toHaveLength(MAX_HANDOVERS_PER_SESSION);
  });
});
