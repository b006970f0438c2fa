import { describe, expect, it } from "vitest";
import { bookIn, moveWorkOrder, assignMechanic, workOrderDetail } from "@/db/shop/work-orders";
import { saveQuoteDraft, sendQuote, approveQuoteAsCustomer } from "@/db/office/quotes";
import { createBike } from "@/db/shop/bikes";
import { handOver } from "@/db/office/invoices";
import { loadOpenItems } from "@/db/records/open-items";
import { storeHandoverCopy } from "@/app/_server/frozen-report";
import { Refusal } from "@/lib/errors";
import { useFakes } from "./support/fakes";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
useFakes(); // the build report is stored in object storage at handover

async function freshJob() {
  const fx = await createShopFixture(db, { status: "handed_over" });
  const bike = await createBike(db, fx.shopId, { customerId: fx.customerId, make: "Halden", model: "Tracer 900" });
  const wo = await bookIn(db, fx.shopId, fx.users.office.id, {
    bikeId: bike.id,
    title: "Top-end rebuild",
    complaint: "Rattle when warm",
    odometerKm: "30110",
  });
  return { fx, bike, wo };
}

const line = { kind: "labour" as const, description: "Strip and inspect", quantityHundredths: 300, unitPriceMinor: 6800 };

describe("work-order state flow", () => {
  it("books a bike in with the next number, the intake note and a first transition by the office user", async () => {
    const { fx, wo } = await freshJob();
    expect(wo.number).toBe(2); // the fixture's own work order is number 1
    const d = (await workOrderDetail(db, fx.shopId, wo.id))!;
    expect(d.status).toBe("booked_in");
    expect(d.odometerKm).toBe(30110);
    expect(d.notes).toMatchObject([{ kind: "intake", body: "Rattle when warm" }]);
    expect(d.transitions).toMatchObject([{ from: null, to: "booked_in", byName: fx.users.office.name }]);
  });

  it("refuses a second open work order for the same bike", async () => {
    const { fx, bike } = await freshJob();
    await expect(
      bookIn(db, fx.shopId, fx.users.office.id, { bikeId: bike.id, title: "Again", complaint: "Again", odometerKm: 1 }),
    ).rejects.toThrow(/already has an open work order/);
  });

  it("refuses illegal moves with the reason, records the refusal, and keeps the status", async () => {
    const { fx, wo } = await freshJob();
    await expect(moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "in_build")).rejects.toThrow(
      'A work order cannot go from "Booked in" to "In build".',
    );
    await expect(moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "handed_over")).rejects.toBeInstanceOf(Refusal);
    const d = (await workOrderDetail(db, fx.shopId, wo.id))!;
    expect(d.status).toBe("booked_in");
    expect(d.transitions).toHaveLength(1);
    const refused = await db
      .selectFrom("audit_log")
      .select(["reason"])
      .where("work_order_id", "=", wo.id)
      .where("outcome", "=", "refused")
      .execute();
    expect(refused.map((r) => r.reason)).toContain('A work order cannot go from "Booked in" to "In build".');
  });

  it("walks intake → inspected → quoted → approved (by the customer) → in build, each move recorded with who", async () => {
    const { fx, wo } = await freshJob();
    const office = fx.users.office.id;
    await moveWorkOrder(db, fx.shopId, office, wo.id, "inspected", { note: "teardown done" });
    await expect(moveWorkOrder(db, fx.shopId, office, wo.id, "quoted")).rejects.toThrow("Send a quote to the customer first.");
    await saveQuoteDraft(db, fx.shopId, office, wo.id, { lines: [line], depositMinor: 0 });
    await sendQuote(db, fx.shopId, office, wo.id);
    await expect(moveWorkOrder(db, fx.shopId, office, wo.id, "approved")).rejects.toThrow(/Only the customer/);
    const quote = await db.selectFrom("quotes").select("id").where("work_order_id", "=", wo.id).executeTakeFirstOrThrow();
    await approveQuoteAsCustomer(db, { id: fx.users.customer.id, shopId: fx.shopId, customerId: fx.customerId }, quote.id);
    await expect(moveWorkOrder(db, fx.shopId, office, wo.id, "in_build")).rejects.toThrow(/Assign a mechanic/);
    await assignMechanic(db, fx.shopId, office, wo.id, fx.users.mechanic.id);
    await expect(moveWorkOrder(db, fx.shopId, office, wo.id, "in_build")).rejects.toThrow(/Pin at least one procedure/);
    await moveWorkOrder(db, fx.shopId, office, wo.id, "in_build", { templateVersionIds: [fx.templates.head.versionId] });
    const d = (await workOrderDetail(db, fx.shopId, wo.id))!;
    expect(d.status).toBe("in_build");
    expect(d.transitions.map((t) => [t.from, t.to, t.byName])).toEqual([
      [null, "booked_in", fx.users.office.name],
      ["booked_in", "inspected", fx.users.office.name],
      ["inspected", "quoted", fx.users.office.name],
      ["quoted", "approved", fx.users.customer.name],
      ["approved", "in_build", fx.users.office.name],
    ]);
    expect(d.transitions.every((t) => t.at instanceof Date)).toBe(true);
    expect(d.procedures).toMatchObject([{ key: "cylinder-head-installation", version: 1 }]);
  });

  it("pins each procedure version once: twice in one move, or again when it is pinned already, is refused in words", async () => {
    const { fx, wo } = await freshJob();
    const office = fx.users.office.id;
    await moveWorkOrder(db, fx.shopId, office, wo.id, "inspected");
    await saveQuoteDraft(db, fx.shopId, office, wo.id, { lines: [line], depositMinor: 0 });
    const { quoteId } = await sendQuote(db, fx.shopId, office, wo.id);
    await approveQuoteAsCustomer(db, { id: fx.users.customer.id, shopId: fx.shopId, customerId: fx.customerId }, quoteId);
    await assignMechanic(db, fx.shopId, office, wo.id, fx.users.mechanic.id);
    const head = fx.templates.head.versionId;
    await expect(moveWorkOrder(db, fx.shopId, office, wo.id, "in_build", { templateVersionIds: [head, head] })).rejects.toMatchObject({
      status: 422,
      message: expect.stringMatching(/^“.+” \(version 1\) is chosen twice: pin each procedure once\.$/),
    });
    expect(await db.selectFrom("job_procedures").select("id").where("work_order_id", "=", wo.id).execute()).toHaveLength(0);
    await moveWorkOrder(db, fx.shopId, office, wo.id, "in_build", { templateVersionIds: [head] });
    await moveWorkOrder(db, fx.shopId, office, wo.id, "in_review");
    await expect(moveWorkOrder(db, fx.shopId, office, wo.id, "in_build", { templateVersionIds: [head] })).rejects.toMatchObject({
      status: 422,
      message: expect.stringMatching(/is already pinned on this job: its steps are on the bench already\.$/),
    });
    expect(await db.selectFrom("job_procedures").select("id").where("work_order_id", "=", wo.id).execute()).toHaveLength(1);
    // back to build with a different procedure is fine
    await moveWorkOrder(db, fx.shopId, office, wo.id, "in_build", { templateVersionIds: [fx.templates.bottom.versionId] });
    expect(await db.selectFrom("job_procedures").select("id").where("work_order_id", "=", wo.id).execute()).toHaveLength(2);
  });

  it("holds the job out of build until the deposit is paid", async () => {
    const { fx, wo } = await freshJob();
    const office = fx.users.office.id;
    await moveWorkOrder(db, fx.shopId, office, wo.id, "inspected");
    await saveQuoteDraft(db, fx.shopId, office, wo.id, { lines: [line], depositMinor: 5000 });
    const { quoteId } = await sendQuote(db, fx.shopId, office, wo.id);
    await approveQuoteAsCustomer(db, { id: fx.users.customer.id, shopId: fx.shopId, customerId: fx.customerId }, quoteId);
    await assignMechanic(db, fx.shopId, office, wo.id, fx.users.mechanic.id);
    await expect(
      moveWorkOrder(db, fx.shopId, office, wo.id, "in_build", { templateVersionIds: [fx.templates.head.versionId] }),
    ).rejects.toThrow("The deposit has not been paid yet.");
    // nothing was pinned by the refused move
    const pinned = await db.selectFrom("job_procedures").select("id").where("work_order_id", "=", wo.id).execute();
    expect(pinned).toHaveLength(0);
  });

  it("does not let one shop move another shop's work order", async () => {
    const { wo } = await freshJob();
    const other = await createShopFixture(db);
    await expect(moveWorkOrder(db, other.shopId, other.users.office.id, wo.id, "inspected")).rejects.toThrow(
      "No such work order in this shop.",
    );
  });
});

describe("customer approval", () => {
  it("lets a customer approve only their own quote", async () => {
    const { fx, wo } = await freshJob();
    await moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "inspected");
    await saveQuoteDraft(db, fx.shopId, fx.users.office.id, wo.id, { lines: [line], depositMinor: 0 });
    const { quoteId } = await sendQuote(db, fx.shopId, fx.users.office.id, wo.id);
    const stranger = await createShopFixture(db);
    const err = await approveQuoteAsCustomer(
      db,
      { id: stranger.users.customer.id, shopId: stranger.shopId, customerId: stranger.customerId },
      quoteId,
    ).catch((e) => e);
    expect(err).toBeInstanceOf(Refusal);
    expect(err.status).toBe(403);
    // same shop, different customer
    const c2 = await db
      .insertInto("customers")
      .values({ shop_id: fx.shopId, name: "Other Rider", email: null, phone: null })
      .returning("id")
      .executeTakeFirstOrThrow();
    const err2 = await approveQuoteAsCustomer(db, { id: fx.users.office.id, shopId: fx.shopId, customerId: c2.id }, quoteId).catch(
      (e) => e,
    );
    expect(err2.status).toBe(403);
    const q = await db.selectFrom("quotes").select("status").where("id", "=", quoteId).executeTakeFirstOrThrow();
    expect(q.status).toBe("sent");
    await approveQuoteAsCustomer(db, { id: fx.users.customer.id, shopId: fx.shopId, customerId: fx.customerId }, quoteId);
    const after = await db.selectFrom("quotes").select(["status", "approved_by"]).where("id", "=", quoteId).executeTakeFirstOrThrow();
    expect(after).toEqual({ status: "approved", approved_by: fx.users.customer.id });
  });
});

describe("handover", () => {
  it("writes the final invoice (total less the deposit paid) with the move, numbered per shop", async () => {
    const { fx, wo } = await freshJob();
    const office = fx.users.office.id;
    await moveWorkOrder(db, fx.shopId, office, wo.id, "inspected");
    // by hand: 4 h × £70.00 = £280.00; tax 20 % = £56.00; total £336.00; deposit £100.00 → balance £236.00
    await saveQuoteDraft(db, fx.shopId, office, wo.id, {
      lines: [{ kind: "labour", description: "Rebuild", quantityHundredths: 400, unitPriceMinor: 7000 }],
      depositMinor: 10000,
    });
    const { quoteId } = await sendQuote(db, fx.shopId, office, wo.id);
    const cust = { id: fx.users.customer.id, shopId: fx.shopId, customerId: fx.customerId };
    await approveQuoteAsCustomer(db, cust, quoteId);
    await db
      .insertInto("deposits")
      .values({
        shop_id: fx.shopId,
        work_order_id: wo.id,
        quote_id: quoteId,
        amount_minor: 10000,
        currency: "EUR",
        payment_intent_id: null,
        status: "paid",
        paid_at: new Date(),
      })
      .execute();
    await assignMechanic(db, fx.shopId, office, wo.id, fx.users.mechanic.id);
    await moveWorkOrder(db, fx.shopId, office, wo.id, "in_build", { templateVersionIds: [fx.templates.bottom.versionId] });
    await moveWorkOrder(db, fx.shopId, office, wo.id, "in_review");
    const storeReport = (trx: typeof db) => storeHandoverCopy(trx, fx.shopId, wo.id, office);
    await expect(handOver(db, fx.shopId, office, wo.id, { storeReport })).rejects.toThrow(
      'A work order cannot go from "In review" to "Handed over".',
    );
    expect(await db.selectFrom("invoices").select("id").where("work_order_id", "=", wo.id).execute()).toHaveLength(0);
    // nothing was done at the bench: both moves need the office's override (the gates: gates-and-override.test.ts)
    const override = async () => ({
      reason: "Invoice test: the bench record is not part of it",
      openItemKeys: (await loadOpenItems(db, fx.shopId, wo.id))!.map((i) => i.key),
    });
    await moveWorkOrder(db, fx.shopId, office, wo.id, "ready", { override: await override() });
    const { invoice: inv } = await handOver(db, fx.shopId, office, wo.id, { storeReport, override: await override() });
    expect(inv).toMatchObject({
      number: 5001,
      subtotal_minor: 28000,
      tax_minor: 5600,
      total_minor: 33600,
      deposits_paid_minor: 10000,
      balance_due_minor: 23600,
    });
    const d = (await workOrderDetail(db, fx.shopId, wo.id))!;
    expect(d.status).toBe("handed_over");
    const closed = await db.selectFrom("work_orders").select("closed_at").where("id", "=", wo.id).executeTakeFirstOrThrow();
    expect(closed.closed_at).toBeInstanceOf(Date);
  });
});
