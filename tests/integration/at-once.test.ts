import { randomUUID } from "node:crypto";
import { expect, it } from "vitest";
import type { Refusal } from "@/lib/errors";
import { POST as addResource } from "@/app/api/office/resources/route";
import { POST as makeBike } from "@/app/api/office/bikes/route";
import { POST as makeUser } from "@/app/api/office/users/route";
import { openDeposit } from "@/db/office/deposits";
import { issueBill } from "@/db/office/final-bill";
import { recordTuneVersion } from "@/db/records/tunes";
import { createBike } from "@/db/shop/bikes";
import { createCustomer } from "@/db/shop/customers";
import { approveQuoteAsCustomer, saveQuoteDraft, sendQuote } from "@/db/office/quotes";
import { bookIn, moveWorkOrder } from "@/db/shop/work-orders";
import { createTemplateVersion } from "@/db/templates/versions";
import { turboKitTemplate } from "@/lib/procedures/demo-templates/turbo-kit";
import { insertQuotedJob } from "./support/quoted-job";
import { appRequest } from "./support/route-calls";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// The same thing saved twice at once — a double click on Save, two people in the office — is
// decided one request after the other: the first is saved, the others are told why not in words
// (or, where the shop gives the number, get the next one). Never a server error from a unique
// index, and never two records where the shop keeps one (two sign-ins for one customer, two open
// jobs for one bike). Each case sends six at once.

const db = useTestDb();
const AT_ONCE = 6;
const post = (path: string, body: unknown) =>
  appRequest(path, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
const office = (fx: ShopFixture) => ({ ...fx.users.office, customerId: null });
const atOnce = <T>(f: (i: number) => Promise<T>) => Promise.all(Array.from({ length: AT_ONCE }, (_, i) => f(i)));
const answers = (responses: Response[]) => Promise.all(responses.map(async (r) => ({ status: r.status, body: await r.json() })));
const statuses = (a: Array<{ status: number }>) => a.map((x) => x.status).sort();
const oneSavedFiveTold = (saved: number, told: number) => [saved, ...Array(AT_ONCE - 1).fill(told)];

it("a sign-in for one e-mail, or for one customer, is made once; the others are told it exists", async () => {
  const fx = await createShopFixture(db);
  const password = "a-Long-password-9876";
  const same = await answers(
    await atOnce(() =>
      makeUser.handle(
        post("/api/office/users", { name: "Twin", email: "twin@example.test", role: "mechanic", password, customerId: null }),
        {
          user: office(fx),
          db,
        },
      ),
    ),
  );
  expect(statuses(same)).toEqual(oneSavedFiveTold(201, 409));
  expect(same.filter((a) => a.status === 409).map((a) => a.body.error)).toEqual(
    Array(AT_ONCE - 1).fill("That e-mail already has a sign-in."),
  );

  // one customer, six addresses: one sign-in, as one request at a time gives (no index says so)
  const { id: customerId } = await createCustomer(db, fx.shopId, { name: "Ada Owner" });
  const owner = await answers(
    await atOnce((i) =>
      makeUser.handle(
        post("/api/office/users", { name: "Ada Owner", email: `ada${i}@example.test`, role: "customer", password, customerId }),
        {
          user: office(fx),
          db,
        },
      ),
    ),
  );
  expect(statuses(owner)).toEqual(oneSavedFiveTold(201, 409));
  expect(owner.filter((a) => a.status === 409).map((a) => a.body.error)).toEqual(
    Array(AT_ONCE - 1).fill("That customer already has a sign-in."),
  );
  expect(await db.selectFrom("users").select("id").where("customer_id", "=", customerId).execute()).toHaveLength(1);
});

it("bikes registered at once each get the shop's next free tag; one chosen tag goes on one bike", async () => {
  const fx = await createShopFixture(db);
  const given = await answers(
    await atOnce(() =>
      makeBike.handle(post("/api/office/bikes", { customerId: fx.customerId, make: "Ostrava", model: "S4" }), { user: office(fx), db }),
    ),
  );
  expect(statuses(given)).toEqual(Array(AT_ONCE).fill(201));
  expect(new Set(given.map((a) => a.body.tagCode)).size).toBe(AT_ONCE);

  const chosen = await answers(
    await atOnce(() =>
      makeBike.handle(post("/api/office/bikes", { customerId: fx.customerId, make: "Ostrava", model: "S4", tagCode: "TWIN-77" }), {
        user: office(fx),
        db,
      }),
    ),
  );
  expect(statuses(chosen)).toEqual(oneSavedFiveTold(201, 422));
  expect(chosen.filter((a) => a.status === 422).map((a) => a.body.error)).toEqual(
    Array(AT_ONCE - 1).fill("Tag TWIN-77 is already on another bike."),
  );
});

it("a resource name is taken once", async () => {
  const fx = await createShopFixture(db);
  const added = await answers(
    await atOnce(() =>
      addResource.handle(post("/api/office/resources", { kind: "bay", name: "Bay 9" }), { user: office(fx), db, params: {} }),
    ),
  );
  expect(statuses(added)).toEqual(oneSavedFiveTold(201, 409));
  expect(added.filter((a) => a.status === 409).map((a) => a.body.error)).toEqual(
    Array(AT_ONCE - 1).fill("The shop already has a resource called Bay 9."),
  );
});

it("one bike booked in six times at once has one open job; the others are told its number", async () => {
  const fx = await createShopFixture(db, { status: "handed_over" });
  const bike = await createBike(db, fx.shopId, { customerId: fx.customerId, make: "Marlin", model: "Sixty" });
  const tries = await Promise.allSettled(
    Array.from({ length: AT_ONCE }, () =>
      bookIn(db, fx.shopId, fx.users.office.id, { bikeId: bike.id, title: "Rebuild", complaint: "Tired", odometerKm: 9 }),
    ),
  );
  const booked = tries.flatMap((t) => (t.status === "fulfilled" ? [t.value] : []));
  expect(booked).toHaveLength(1);
  const refused = tries.flatMap((t) => (t.status === "rejected" ? [(t.reason as Error).message] : []));
  expect(refused).toEqual(Array(AT_ONCE - 1).fill(`This bike already has an open work order (#${booked[0].number}).`));
});

it("bills of six jobs issued at once get six numbers", async () => {
  const fx = await createShopFixture(db);
  const jobs = await Promise.all(
    Array.from({ length: AT_ONCE }, async (_, i) => {
      const { workOrderId, quoteId } = await insertQuotedJob(db, fx, { number: 5001 + i, title: `Job ${i}`, status: "in_build" });
      await db
        .insertInto("quote_lines")
        .values({
          quote_id: quoteId,
          position: 0,
          kind: "labour",
          description: "Strip",
          quantity_hundredths: 100,
          unit_price_minor: 5000,
          line_total_minor: 5000,
        })
        .execute();
      return workOrderId;
    }),
  );
  const bills = await Promise.all(jobs.map((id) => issueBill(db, fx.shopId, fx.users.office.id, id, {})));
  expect(new Set(bills.map((b) => b.number)).size).toBe(AT_ONCE);
});

it("a new template imported six times at once is one template with six versions", async () => {
  const fx = await createShopFixture(db);
  const made = await Promise.all(
    Array.from({ length: AT_ONCE }, () => createTemplateVersion(db, fx.shopId, turboKitTemplate, fx.users.office.id)),
  );
  expect(new Set(made.map((m) => m.templateId)).size).toBe(1);
  expect(made.map((m) => m.version).sort()).toEqual([1, 2, 3, 4, 5, 6]);
});

it("a tune's label is given once on a job, however many uploads of it arrive at once", async () => {
  const fx = await createShopFixture(db);
  const tries = await Promise.allSettled(
    Array.from({ length: AT_ONCE }, () => {
      const id = randomUUID();
      return recordTuneVersion(db, { id: fx.users.supervisor.id, shopId: fx.shopId }, fx.workOrderId, {
        id,
        label: "v3 10 psi",
        notes: "",
        fileName: "v3.bin",
        contentType: "application/octet-stream",
        sizeBytes: 4,
        sha256: "0".repeat(64),
        objectKey: `tunes/${fx.shopId}/${fx.workOrderId}/${id}`,
      });
    }),
  );
  expect(tries.filter((t) => t.status === "fulfilled")).toHaveLength(1);
  const refused = tries.flatMap((t) => (t.status === "rejected" ? [t.reason as Refusal] : []));
  expect(refused.map((r) => [r.status, r.issues[0]?.message])).toEqual(
    Array(AT_ONCE - 1).fill([409, "This work order already has a tune labelled “v3 10 psi”: give the new version its own label."]),
  );
});

it("a revised quote sent while the customer approves the one sent: one of the two stands, never both", async () => {
  const fx = await createShopFixture(db);
  const cust = { id: fx.users.customer.id, shopId: fx.shopId, customerId: fx.customerId };
  const line = (price: number) => ({
    lines: [{ kind: "labour" as const, description: "Rebuild", quantityHundredths: 100, unitPriceMinor: price }],
    depositMinor: 0,
  });
  async function sentWithRevision() {
    const bike = await createBike(db, fx.shopId, { customerId: fx.customerId, make: "Ostrava", model: "S4" });
    const wo = await bookIn(db, fx.shopId, fx.users.office.id, { bikeId: bike.id, title: "Rebuild", complaint: "Tired", odometerKm: 100 });
    await moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "inspected");
    await saveQuoteDraft(db, fx.shopId, fx.users.office.id, wo.id, line(10_000));
    const { quoteId } = await sendQuote(db, fx.shopId, fx.users.office.id, wo.id);
    await saveQuoteDraft(db, fx.shopId, fx.users.office.id, wo.id, line(12_000));
    return { workOrderId: wo.id, sentId: quoteId };
  }
  const stateOf = async (workOrderId: string) => ({
    job: (await db.selectFrom("work_orders").select("status").where("id", "=", workOrderId).executeTakeFirstOrThrow()).status,
    quotes: (
      await db.selectFrom("quotes").select(["version", "status"]).where("work_order_id", "=", workOrderId).orderBy("version").execute()
    ).map((q) => `v${q.version} ${q.status}`),
  });

  // one after the other: the approval stands, and the draft is refused in words
  const a = await sentWithRevision();
  await approveQuoteAsCustomer(db, cust, a.sentId);
  await expect(sendQuote(db, fx.shopId, fx.users.office.id, a.workOrderId)).rejects.toMatchObject({
    status: 409,
    message: expect.stringMatching(/^The customer has approved a quote already/),
  });
  expect(await stateOf(a.workOrderId)).toEqual({ job: "approved", quotes: ["v1 approved", "v2 draft"] });

  // at once, six times over: whichever goes first stands, and the other is refused
  for (let i = 0; i < AT_ONCE; i++) {
    const j = await sentWithRevision();
    const [send, approve] = await Promise.allSettled([
      sendQuote(db, fx.shopId, fx.users.office.id, j.workOrderId),
      approveQuoteAsCustomer(db, cust, j.sentId),
    ]);
    expect([send.status, approve.status].sort()).toEqual(["fulfilled", "rejected"]);
    const refused = (send.status === "rejected" ? send.reason : (approve as PromiseRejectedResult).reason) as Refusal;
    expect(refused.status).toBe(409);
    expect(await stateOf(j.workOrderId)).toEqual(
      send.status === "fulfilled"
        ? { job: "quoted", quotes: ["v1 superseded", "v2 sent"] }
        : { job: "approved", quotes: ["v1 approved", "v2 draft"] },
    );
  }
});

it("paying the deposit while the same quote is approved again (two tabs): each is answered, neither deadlocks", async () => {
  const fx = await createShopFixture(db);
  const cust = { id: fx.users.customer.id, shopId: fx.shopId, customerId: fx.customerId };
  for (let i = 0; i < AT_ONCE; i++) {
    const bike = await createBike(db, fx.shopId, { customerId: fx.customerId, make: "Ostrava", model: `S${i}` });
    const wo = await bookIn(db, fx.shopId, fx.users.office.id, { bikeId: bike.id, title: "Rebuild", complaint: "Tired", odometerKm: 100 });
    await moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "inspected");
    await saveQuoteDraft(db, fx.shopId, fx.users.office.id, wo.id, {
      lines: [{ kind: "labour", description: "Rebuild", quantityHundredths: 100, unitPriceMinor: 10_000 }],
      depositMinor: 2_000,
    });
    const { quoteId } = await sendQuote(db, fx.shopId, fx.users.office.id, wo.id);
    await approveQuoteAsCustomer(db, cust, quoteId);
    // the quote is approved: a second approval (another tab) is refused in words; the deposit opens
    const results = await Promise.allSettled([
      approveQuoteAsCustomer(db, cust, quoteId),
      openDeposit(db, cust, quoteId),
      approveQuoteAsCustomer(db, cust, quoteId),
      openDeposit(db, cust, quoteId),
    ]);
    for (const r of results) if (r.status === "rejected") expect((r.reason as Refusal).status, String(r.reason)).toBe(409);
    expect(results[1].status).toBe("fulfilled");
    expect(await db.selectFrom("deposits").select("id").where("work_order_id", "=", wo.id).execute()).toHaveLength(1);
  }
});
