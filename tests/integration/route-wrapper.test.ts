import { describe, expect, it } from "vitest";
import { GET as customers, POST as addCustomer } from "@/app/api/office/customers/route";
import { POST as sync } from "@/app/api/sync/route";
import { createDb } from "@/db/setup/client";
import type { SessionUser } from "@/lib/auth/session-user";
import { DATABASE_NOT_ANSWERING } from "@/lib/errors";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { APP_ORIGIN, appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

// The route wrapper against the real database: the checks it makes before a handler runs, the
// one error body, and the 503 when the database does not answer (the session lookup included).
const db = useTestDb();
const asUser = (u: ShopFixture["users"]["office"]): SessionUser => ({ ...u, customerId: null });
const json = (body: unknown, headers: Record<string, string> = {}) => ({
  method: "POST",
  headers: { "content-type": "application/json", ...headers },
  body: JSON.stringify(body),
});

describe("the route wrapper", () => {
  it("writes a customer from our own page (Origin or Sec-Fetch-Site) and refuses one from elsewhere", async () => {
    const fx = await createShopFixture(db);
    const office = asUser(fx.users.office);
    const ok = await addCustomer.handle(appRequest("/api/office/customers", json({ name: "Ada Example" })), { user: office, db });
    expect(ok.status).toBe(201);
    const fetchMeta = await addCustomer.handle(
      new Request(`${APP_ORIGIN}/api/office/customers`, json({ name: "Bo Example" }, { "sec-fetch-site": "same-origin" })),
      { user: office, db },
    );
    expect(fetchMeta.status).toBe(201);
    const forged = await addCustomer.handle(
      new Request(`${APP_ORIGIN}/api/office/customers`, json({ name: "Cy Forged" }, { origin: "https://elsewhere.example" })),
      { user: office, db },
    );
    expect(forged.status).toBe(403);
    const names = await db.selectFrom("customers").select("name").where("shop_id", "=", fx.shopId).execute();
    expect(names.map((n) => n.name).sort()).toEqual(expect.not.arrayContaining(["Cy Forged"]));
    expect(names.map((n) => n.name)).toEqual(expect.arrayContaining(["Ada Example", "Bo Example"]));
  });

  it("refuses a text/plain post (415), an oversized body (413) and bad fields (400, in workshop words)", async () => {
    const fx = await createShopFixture(db);
    const office = asUser(fx.users.office);
    const plain = await addCustomer.handle(
      appRequest("/api/office/customers", { method: "POST", headers: { "content-type": "text/plain" }, body: '{"name":"Di Plain"}' }),
      { user: office, db },
    );
    expect([plain.status, await plain.json()]).toEqual([
      415,
      { error: "This request takes application/json; text/plain was sent.", issues: [] },
    ]);
    const huge = new TextEncoder().encode(JSON.stringify({ name: "Ed Huge", notes: "n".repeat(300 * 1024) }));
    const stream = new ReadableStream<Uint8Array>({
      start(c) {
        for (let i = 0; i < huge.byteLength; i += 64 * 1024) c.enqueue(huge.subarray(i, i + 64 * 1024));
        c.close();
      },
    });
    const big = await addCustomer.handle(
      appRequest("/api/office/customers", { method: "POST", headers: { "content-type": "application/json" }, body: stream }),
      { user: office, db },
    );
    expect(big.status).toBe(413);
    const bad = await addCustomer.handle(
      appRequest("/api/office/customers", json({ name: "Fay Example", notes: "n".repeat(2001), phone: 12 })),
      { user: office, db },
    );
    expect(bad.status).toBe(400);
    expect(await bad.json()).toEqual({
      error: "Check the marked fields.",
      issues: [
        { path: "phone", message: "Phone: must be text" },
        { path: "notes", message: "Notes: at most 2000 characters" },
      ],
    });
    const query = await customers.handle(appRequest("/api/office/customers?size=500&dir=sideways"), { user: office, db });
    expect([query.status, (await query.json()).issues]).toEqual([
      400,
      [
        { path: "size", message: "Page size: must be at most 100" },
        { path: "dir", message: "Sort order: choose asc or desc" },
      ],
    ]);
    expect(
      await db
        .selectFrom("customers")
        .select("id")
        .where("shop_id", "=", fx.shopId)
        .where("name", "in", ["Di Plain", "Ed Huge", "Fay Example"])
        .execute(),
    ).toEqual([]);
  });

  it("answers 503 with the one body when the database does not answer, the session lookup included", async () => {
    const fx = await createShopFixture(db);
    const gone = createDb("postgres://benchtag@127.0.0.1:1/benchtag", 1);
    try {
      const lookup = await customers.handle(appRequest("/api/office/customers"), { userId: fx.users.office.id, db: gone });
      expect([lookup.status, await lookup.json()]).toEqual([503, { error: DATABASE_NOT_ANSWERING, issues: [] }]);
      const merge = await sync.handle(appRequest("/api/sync", json({ deviceId: "tab-gone", cursor: null, operations: [] })), {
        user: asUser(fx.users.mechanic),
        db: gone,
      });
      expect([merge.status, await merge.json()]).toEqual([503, { error: DATABASE_NOT_ANSWERING, issues: [] }]);
    } finally {
      await gone.destroy();
    }
  });

  it("looks the signed-in user up in the database: a deactivated account is nobody", async () => {
    const fx = await createShopFixture(db);
    const res = await customers.handle(appRequest("/api/office/customers"), { userId: fx.users.office.id, db });
    expect(res.status).toBe(200);
    await db.updateTable("users").set({ active: false }).where("id", "=", fx.users.office.id).execute();
    const after = await customers.handle(appRequest("/api/office/customers"), { userId: fx.users.office.id, db });
    expect([after.status, await after.json()]).toEqual([401, { error: "Sign in first.", issues: [] }]);
  });
});
