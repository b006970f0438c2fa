import { describe, expect, it } from "vitest";
import { createBike } from "@/db/shop/bikes";
import { addPartFitted, bikesWithPart } from "@/db/office/parts";
import { bookIn } from "@/db/shop/work-orders";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

describe("parts traceability", () => {
  it("answers which bikes got batch X, across jobs, from one shop only", async () => {
    const fx = await createShopFixture(db);
    const batch = `PB-${Date.now()}`;
    const step = fx.stepByKey["rod-bolts"];
    await addPartFitted(db, fx.shopId, fx.users.mechanic.id, fx.workOrderId, {
      partNumber: "ROD-BOLT-8",
      supplier: "Kestrel Fasteners",
      batch,
      quantity: 8,
      stepId: step.id,
    });
    const bike2 = await createBike(db, fx.shopId, { customerId: fx.customerId, make: "Marlin", model: "Sixty Sport" });
    const wo2 = await bookIn(db, fx.shopId, fx.users.office.id, { bikeId: bike2.id, title: "Rods", complaint: "Knock", odometerKm: 9 });
    await addPartFitted(db, fx.shopId, fx.users.mechanic.id, wo2.id, {
      partNumber: "ROD-BOLT-8",
      batch: batch.toLowerCase(),
      serial: "SN-1",
    });
    await addPartFitted(db, fx.shopId, fx.users.mechanic.id, wo2.id, { partNumber: "ROD-BOLT-8", batch: "OTHER-BATCH" });
    // another shop fitted the same batch: not visible here
    const other = await createShopFixture(db);
    await addPartFitted(db, other.shopId, other.users.mechanic.id, other.workOrderId, { partNumber: "ROD-BOLT-8", batch });

    const hits = await bikesWithPart(db, fx.shopId, ` ${batch} `);
    expect(hits.map((h) => [h.tagCode, h.workOrderNumber]).sort()).toEqual(
      [
        [bike2.tagCode, wo2.number],
        [fx.bike.tag_code, 1],
      ].sort(),
    );
    expect(hits.find((h) => h.tagCode === fx.bike.tag_code)).toMatchObject({ supplier: "Kestrel Fasteners", partNumber: "ROD-BOLT-8" });
    expect(await bikesWithPart(db, other.shopId, batch)).toHaveLength(1);
    expect(await bikesWithPart(db, fx.shopId, "SN-1", "serial")).toHaveLength(1);
  });

  it("refuses a step that is not part of the job's procedures", async () => {
    const fx = await createShopFixture(db);
    const other = await createShopFixture(db);
    await expect(
      addPartFitted(db, fx.shopId, fx.users.mechanic.id, fx.workOrderId, { partNumber: "X", stepId: other.stepByKey["rod-bolts"].id }),
    ).rejects.toThrow("That step is not part of this job's procedures.");
  });
});
