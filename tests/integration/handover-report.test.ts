import { describe, expect, it } from "vitest";
import { PDFParse } from "pdf-parse";
import { renderHandoverReportPdf, ReportNotFoundError } from "@/app/_server/handover-report";
import { saveDynoRun } from "@/db/records/dyno";
import { reportWorkOrderFor } from "@/db/records/handover-report";
import { seedDemoBuildRecord } from "@/db/seed/demo-dyno";
import type { SessionUser } from "@/lib/auth/session-user";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

async function pdfText(buf: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(buf) });
  try {
    return (await parser.getText()).text.replace(/\s+/g, " ");
  } finally {
    await parser.destroy();
  }
}

const asUser = (fx: ShopFixture, key: keyof ShopFixture["users"]): SessionUser => {
  const u = fx.users[key];
  return {
    id: u.id,
    shopId: fx.shopId,
    role: u.role,
    name: u.name,
    email: u.email,
    customerId: u.role === "customer" ? fx.customerId : null,
  };
};

// A run whose figures the test works out by hand: ISO 1585 at its own reference air (99 kPa dry,
// 25 °C), so the correction factor is exactly 1 (REFERENCE-CHECKS, calc), and
// P = T · n · 2π / 60 000: 120 N·m at 7000 rpm = 87.96 kW; 100 N·m at 9000 rpm = 94.248 kW (peak).
async function addKnownRun(fx: ShopFixture) {
  await saveDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, {
    label: "Check run",
    ranOn: "2026-11-30",
    boostTarget: 8,
    boostUnit: "psi",
    pressureKpa: 99,
    temperatureC: 25,
    humidityPercent: 0,
    standard: "ISO_1585",
    notes: "Baffle out",
    source: "table",
    torqueUnit: "N·m",
    points: [
      { rpm: 5000, torque: 110, torqueNm: 110 },
      { rpm: 7000, torque: 120, torqueNm: 120 },
      { rpm: 9000, torque: 100, torqueNm: 100 },
    ],
  });
}

describe("handover build report PDF (real PostgreSQL, parsed with pdf-parse)", () => {
  it("holds every section, the bike, the parts, readings, sign-offs and the dyno figures", async () => {
    const fx = await createShopFixture(db);
    await seedDemoBuildRecord(db, {
      shopId: fx.shopId,
      workOrderId: fx.workOrderId,
      mechanicId: fx.users.mechanic.id,
      supervisorId: fx.users.supervisor.id,
      start: new Date("2026-11-10T08:00:00Z"),
    });
    await addKnownRun(fx);
    const buf = await renderHandoverReportPdf(db, fx.shopId, fx.workOrderId);
    expect(buf.subarray(0, 5).toString()).toBe("%PDF-");
    const text = await pdfText(buf);
    for (const section of [
      "Build report",
      "The bike",
      "Work done",
      "Parts fitted",
      "Measurements against spec",
      "Torque applied",
      "Sign-offs and reviews",
      "Dyno results",
      "Run-in advice",
      "Cautions",
    ]) {
      expect(text, section).toContain(section);
    }
    expect(text).toContain("Fixture Test 1000");
    expect(text).toContain(fx.bike.tag_code);
    expect(text).toContain("KF-7600-FP");
    expect(text).toContain("B24-331"); // batch
    expect(text).toContain("Cylinder 1 bore, Top thrust");
    expect(text).toContain("76.008 mm");
    expect(text).toMatch(/All \d+ current readings are within spec/);
    // bore: top 76.008/76.006, middle 76.007/76.006, bottom 76.005/76.005 → taper 0.003, out-of-round 0.002 (hand arithmetic)
    expect(text).toContain("taper 0.0030 mm, out-of-round 0.0020 mm");
    expect(text).toContain("Approved by sup");
    expect(text).toContain("waiting for review");
    expect(text).toContain("Check run");
    expect(text).toContain("94.2 kW"); // 94.248 kW
    expect(text).toContain("at 9000 rpm");
    expect(text).toContain("120.0 N·m");
    expect(text).toContain("factor 1.0000");
    // no "power per psi" figure any more: power does not scale with boost alone
    expect(text).not.toMatch(/per psi/i);
    expect(text).toContain("none named"); // the run names no tune
    expect(text).toContain("maker's service data");
  });

  it("a work order with nothing recorded still renders, saying so", async () => {
    const fx = await createShopFixture(db);
    const text = await pdfText(await renderHandoverReportPdf(db, fx.shopId, fx.workOrderId));
    expect(text).toContain("No parts recorded.");
    expect(text).toContain("No dyno runs recorded.");
  });

  it("another shop's work order is refused", async () => {
    const a = await createShopFixture(db);
    const b = await createShopFixture(db);
    await expect(renderHandoverReportPdf(db, a.shopId, b.workOrderId)).rejects.toBeInstanceOf(ReportNotFoundError);
  });
});

describe("who may have a work order's report", () => {
  it("office and supervisor of the shop, and the bike's owner; not another customer or another shop", async () => {
    const fx = await createShopFixture(db);
    const other = await createShopFixture(db);
    expect((await reportWorkOrderFor(db, asUser(fx, "office"), fx.workOrderId))?.id).toBe(fx.workOrderId);
    expect((await reportWorkOrderFor(db, asUser(fx, "supervisor"), fx.workOrderId))?.id).toBe(fx.workOrderId);
    expect((await reportWorkOrderFor(db, asUser(fx, "customer"), fx.workOrderId))?.id).toBe(fx.workOrderId);
    // a second customer of the same shop, owning nothing on this work order
    const stranger = await db
      .insertInto("customers")
      .values({ shop_id: fx.shopId, name: "Someone else", email: null, phone: null })
      .returning("id")
      .executeTakeFirstOrThrow();
    expect(await reportWorkOrderFor(db, { ...asUser(fx, "customer"), customerId: stranger.id }, fx.workOrderId)).toBeNull();
    expect(await reportWorkOrderFor(db, asUser(other, "office"), fx.workOrderId)).toBeNull();
    expect(await reportWorkOrderFor(db, asUser(other, "customer"), fx.workOrderId)).toBeNull();
    expect(await reportWorkOrderFor(db, { ...asUser(fx, "customer"), customerId: null }, fx.workOrderId)).toBeNull();
  });
});
