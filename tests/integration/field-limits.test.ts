import { randomInt, randomUUID } from "node:crypto";
import { expect, it } from "vitest";
import { POST as makeUser } from "@/app/api/office/users/route";
import { POST as syncRoute } from "@/app/api/sync/route";
import { PUT as putQuote } from "@/app/api/office/work-orders/[id]/quote/route";
import { quotesOfWorkOrder } from "@/db/office/quotes";
import { createBike } from "@/db/shop/bikes";
import { bookIn, moveWorkOrder } from "@/db/shop/work-orders";
import { MAX_MINOR } from "@/lib/money/quote-totals";
import { INT4_MAX } from "@/lib/safe-values";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { appRequest } from "./support/route-calls";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// Values a form would never send but a request can, at the edge of what PostgreSQL holds: each is
// either kept whole or refused in words with the field named, never a server error. (The unit test
// tests/unit/routes/every-field-is-bounded.test.ts holds every route's fields to a limit; these are
// the two that had none, through the route to the database.)

const db = useTestDb();
const send = (method: string, path: string, body: unknown) =>
  appRequest(path, { method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
const office = (fx: ShopFixture) => ({ ...fx.users.office, customerId: null });
/** Random letters and digits: a text the database cannot squeeze into an index by compressing it. */
const randomText = (n: number) => Array.from({ length: n }, () => "abcdefghijklmnopqrstuvwxyz0123456789"[randomInt(36)]).join("");

async function inspectedJob(fx: ShopFixture) {
  const bike = await createBike(db, fx.shopId, { customerId: fx.customerId, make: "Ostrava", model: "S4" });
  const wo = await bookIn(db, fx.shopId, fx.users.office.id, { bikeId: bike.id, title: "Rebuild", complaint: "Tired", odometerKm: 100 });
  await moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "inspected");
  return wo.id;
}

it("keeps a quote line priced past PostgreSQL's integer whole, and its totals", async () => {
  const fx = await createShopFixture(db, { status: "handed_over" }); // shop tax 20 %
  const id = await inspectedJob(fx);
  const price = INT4_MAX + 1_000; // 21,474,846.47: more than an integer column holds
  const res = await putQuote.handle(
    send("PUT", `/api/office/work-orders/${id}/quote`, {
      lines: [{ kind: "part", description: "Race engine, complete", quantityHundredths: 200, unitPriceMinor: price }],
      depositMinor: price,
    }),
    { user: office(fx), db, params: { id } },
  );
  expect(res.status).toBe(200);
  const [q] = await quotesOfWorkOrder(db, fx.shopId, id);
  expect(q.lines.map((l) => [l.unitPriceMinor, l.lineTotalMinor])).toEqual([[price, 2 * price]]);
  // by hand: subtotal 2 × 2,147,484,647 = 4,294,969,294; tax 20 % = 858,993,858.8 → 858,993,859
  // (half-up on the subtotal); total 5,153,963,153 — all past 2^31, all kept to the unit
  expect(q).toMatchObject({ subtotalMinor: 4_294_969_294, taxMinor: 858_993_859, totalMinor: 5_153_963_153, depositMinor: price });
});

it("refuses lines that together pass the most a quote holds, in words, saving nothing", async () => {
  const fx = await createShopFixture(db, { status: "handed_over" });
  const id = await inspectedJob(fx);
  const line = { kind: "part", description: "Crank", quantityHundredths: 100, unitPriceMinor: MAX_MINOR }; // each within range alone
  const res = await putQuote.handle(send("PUT", `/api/office/work-orders/${id}/quote`, { lines: [line, line], depositMinor: 0 }), {
    user: office(fx),
    db,
    params: { id },
  });
  expect(res.status).toBe(400);
  expect(await res.json()).toEqual({
    error: "Check the marked fields.",
    issues: [{ path: "lines", message: "together the lines come to more than 100,000,000.00, the most one quote can hold" }],
  });
  expect(await quotesOfWorkOrder(db, fx.shopId, id)).toEqual([]);
});

it("refuses a sign-in's e-mail address longer than any real one, in words, saving nothing", async () => {
  const fx = await createShopFixture(db);
  const email = `${randomText(6_000)}@example.test`; // past the unique index's row limit (about 2.7 kB)
  const res = await makeUser.handle(
    send("POST", "/api/office/users", {
      name: "Long Address",
      email,
      role: "mechanic",
      password: "a-Long-password-9876",
      customerId: null,
    }),
    { user: office(fx), db },
  );
  expect(res.status).toBe(400);
  expect((await res.json()).issues).toEqual([{ path: "email", message: "at most 200 characters" }]);
  const made = await db.selectFrom("users").select("id").where("name", "=", "Long Address").execute();
  expect(made).toEqual([]);
  // at the limit it is kept
  const fits = `${"m".repeat(200 - "@example.test".length)}@example.test`;
  const ok = await makeUser.handle(
    send("POST", "/api/office/users", {
      name: "Long Address",
      email: fits,
      role: "mechanic",
      password: "a-Long-password-9876",
      customerId: null,
    }),
    { user: office(fx), db },
  );
  expect(ok.status).toBe(201);
  expect(await db.selectFrom("users").select("email").where("name", "=", "Long Address").execute()).toEqual([{ email: fits }]);
});

it("refuses a reading or a wrench reading typed with thousands of zeros alone, and merges the rest of the batch", async () => {
  // PostgreSQL's numeric keeps at most 16,383 decimal places: such an entry failed the whole batch
  // (503), and a tablet's outbox could not get past it
  const fx = await createShopFixture(db);
  const specs = await fixtureSpecs(db, fx);
  const mechanic = { ...fx.users.mechanic, customerId: null };
  const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mechanic.id, fx.workOrderId);
  const reading = tablet.read(specs.boreStepId, specs.boreSpecId, 0, 76.004);
  const longReading = { ...reading, payload: { ...reading.payload, value: `76.004${"0".repeat(20_000)}` } };
  const bolt = tablet.bolt(specs.caseBoltsStepId, specs.caseBoltsSpecId, 1, 1);
  const longWrench = { ...bolt, payload: { ...bolt.payload, wrenchReading: `31.5${"0".repeat(20_000)}`, wrenchUnit: "N·m" } };
  const good = tablet.complete(specs.boreStepId);
  const res = await syncRoute.handle(
    send("POST", "/api/sync", { deviceId: tablet.deviceId, cursor: null, operations: [longReading, longWrench, good] }),
    { user: mechanic, db },
  );
  expect(res.status).toBe(200);
  const body = await res.json();
  expect(body.accepted).toEqual([good.id]);
  expect(body.refused.map((r: { id: string; reason: string }) => [r.id, r.reason.split(". ")[0]])).toEqual([
    [longReading.id, "Value: at most 15 digits; no instrument at the bench reads finer"],
    [longWrench.id, "Wrench reading: at most 15 digits; no instrument at the bench reads finer"],
  ]);
  const kept = await db.selectFrom("operations").select("id").where("work_order_id", "=", fx.workOrderId).execute();
  expect(kept.map((o) => o.id)).toEqual([good.id]);
});

it("counts a withdrawal's reason in characters as the column's CHECK does: two emoji are refused alone, three are kept", async () => {
  // "🔧🔧" is four UTF-16 units but two characters (PostgreSQL's length()). zod's length rules count
  // characters too; this holds them to it, since a reason the CHECK refuses would fail the batch
  const fx = await createShopFixture(db);
  const specs = await fixtureSpecs(db, fx);
  const mechanic = { ...fx.users.mechanic, customerId: null };
  const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mechanic.id, fx.workOrderId);
  const bolt = tablet.bolt(specs.caseBoltsStepId, specs.caseBoltsSpecId, 1, 1);
  const first = await syncRoute.handle(send("POST", "/api/sync", tablet.batch([bolt])), { user: mechanic, db });
  expect((await first.json()).accepted).toEqual([bolt.id]);
  const emoji = tablet.make("entry.withdrawn", { operationId: bolt.id, reason: "🔧🔧" });
  const good = tablet.complete(specs.boreStepId);
  const res = await syncRoute.handle(send("POST", "/api/sync", tablet.batch([emoji, good])), { user: mechanic, db });
  expect(res.status).toBe(200);
  const body = await res.json();
  expect(body.accepted).toEqual([good.id]);
  expect(body.refused.map((r: { id: string; reason: string }) => r.id)).toEqual([emoji.id]);
  expect(body.refused[0].reason).toMatch(/^give the reason in a few words\./);
  // three emoji are three characters: taken, and the bolt is withdrawn on the record
  const three = tablet.make("entry.withdrawn", { operationId: bolt.id, reason: "🔧🔧🔧" });
  const again = await syncRoute.handle(send("POST", "/api/sync", tablet.batch([three])), { user: mechanic, db });
  const againBody = await again.json();
  expect(againBody.refused).toEqual([]);
  expect(againBody.accepted).toEqual([three.id]);
  const w = await db.selectFrom("withdrawals").select(["operation_id", "reason"]).where("operation_id", "=", bolt.id).execute();
  expect(w).toEqual([{ operation_id: bolt.id, reason: "🔧🔧🔧" }]);
});
