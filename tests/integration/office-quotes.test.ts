import { describe, expect, it } from "vitest";
import { bookIn, moveWorkOrder } from "@/db/shop/work-orders";
import { quotesOfWorkOrder, saveQuoteDraft, sendQuote } from "@/db/office/quotes";
import { createBike } from "@/db/shop/bikes";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

describe("quotes in the database", () => {
  it("stores line totals, tax on the subtotal (half-up) and the total, in minor units", async () => {
    const fx = await createShopFixture(db, { status: "handed_over" }); // shop tax 20% (2000 bp)
    await db.updateTable("shops").set({ tax_rate_bp: 1750 }).where("id", "=", fx.shopId).execute(); // 17.5%
    const bike = await createBike(db, fx.shopId, { customerId: fx.customerId, make: "Ostrava", model: "S4" });
    const wo = await bookIn(db, fx.shopId, fx.users.office.id, {
      bikeId: bike.id,
      title: "Valve clearances",
      complaint: "Ticking",
      odometerKm: 100,
    });
    await moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "inspected");
    // by hand: 1.5 h × £72.50 = £108.75; 2 × £3.33 = £6.66; subtotal £115.41 = 11541p
    // tax 17.5% = 2019.675p → 2020p (half-up on the subtotal); total 13561p
    const saved = await saveQuoteDraft(db, fx.shopId, fx.users.office.id, wo.id, {
      lines: [
        { kind: "labour", description: "Shim valves", quantityHundredths: 150, unitPriceMinor: 7250 },
        { kind: "part", description: "Shim", partNumber: "SH-250", quantityHundredths: 200, unitPriceMinor: 333 },
      ],
      depositMinor: 4000,
    });
    expect(saved).toMatchObject({ subtotalMinor: 11541, taxMinor: 2020, totalMinor: 13561 });
    const [q] = await quotesOfWorkOrder(db, fx.shopId, wo.id);
    expect(q).toMatchObject({
      status: "draft",
      taxRateBp: 1750,
      subtotalMinor: 11541,
      taxMinor: 2020,
      totalMinor: 13561,
      depositMinor: 4000,
    });
    expect(q.lines.map((l) => l.lineTotalMinor)).toEqual([10875, 666]);
  });

  it("refuses a deposit larger than the total, with the field named", async () => {
    const fx = await createShopFixture(db, { status: "handed_over" });
    const bike = await createBike(db, fx.shopId, { customerId: fx.customerId, make: "Marlin", model: "Sixty" });
    const wo = await bookIn(db, fx.shopId, fx.users.office.id, { bikeId: bike.id, title: "Chain", complaint: "Worn", odometerKm: 5 });
    const err = await saveQuoteDraft(db, fx.shopId, fx.users.office.id, wo.id, {
      lines: [{ kind: "part", description: "Chain", quantityHundredths: 100, unitPriceMinor: 1000 }],
      depositMinor: 1201,
    }).catch((e) => e);
    expect(err.message).toBe("The deposit cannot be more than the quote total.");
    expect(err.issues).toEqual([{ path: "depositMinor", message: "more than the total" }]);
    expect(await quotesOfWorkOrder(db, fx.shopId, wo.id)).toHaveLength(0);
  });

  it("revising a sent quote supersedes it when the new version is sent", async () => {
    const fx = await createShopFixture(db, { status: "handed_over" });
    const bike = await createBike(db, fx.shopId, { customerId: fx.customerId, make: "Corvid", model: "RX" });
    const wo = await bookIn(db, fx.shopId, fx.users.office.id, { bikeId: bike.id, title: "Clutch", complaint: "Slips", odometerKm: 5 });
    await moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "inspected");
    const l = { kind: "part" as const, description: "Plates", quantityHundredths: 100, unitPriceMinor: 9000 };
    await saveQuoteDraft(db, fx.shopId, fx.users.office.id, wo.id, { lines: [l], depositMinor: 0 });
    await sendQuote(db, fx.shopId, fx.users.office.id, wo.id);
    await saveQuoteDraft(db, fx.shopId, fx.users.office.id, wo.id, {
      lines: [l, { ...l, description: "Springs", unitPriceMinor: 2500 }],
      depositMinor: 0,
    });
    await sendQuote(db, fx.shopId, fx.users.office.id, wo.id);
    const qs = await quotesOfWorkOrder(db, fx.shopId, wo.id);
    expect(qs.map((q) => [q.version, q.status])).toEqual([
      [2, "sent"],
      [1, "superseded"],
    ]);
  });
});
