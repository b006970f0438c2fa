import { describe, expect, it } from "vitest";
import { importDynoRun } from "@/db/records/dyno-import";
import { listDynoRuns, saveDynoRun } from "@/db/records/dyno";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

const fields = {
  label: "Baseline 7 psi",
  ranOn: "2026-11-20",
  boostTarget: "7",
  boostUnit: "psi",
  pressureKpa: "100.4",
  temperatureC: "19.5",
  humidityPercent: "55",
  standard: "SAE_J1349",
  notes: "Baffle in",
  tuneVersionId: null,
};

async function counts(workOrderId: string) {
  const runs = await db
    .selectFrom("dyno_runs")
    .select(db.fn.countAll<number>().as("n"))
    .where("work_order_id", "=", workOrderId)
    .executeTakeFirstOrThrow();
  const points = await db
    .selectFrom("dyno_points")
    .innerJoin("dyno_runs", "dyno_runs.id", "dyno_points.run_id")
    .select(db.fn.countAll<number>().as("n"))
    .where("dyno_runs.work_order_id", "=", workOrderId)
    .executeTakeFirstOrThrow();
  return { runs: Number(runs.n), points: Number(points.n) };
}

describe("dyno run import (real PostgreSQL)", () => {
  it("stores a CSV run and reads it back with values as written", async () => {
    const fx = await createShopFixture(db);
    const csv = "rpm,torque_lbft\n4000,58.5\n5000,66.25\n6000,70\n";
    const r = await importDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, { ...fields, curve: { source: "csv", text: csv } });
    expect(r.ok).toBe(true);
    const runs = await listDynoRuns(db, fx.shopId, fx.workOrderId);
    expect(runs).toHaveLength(1);
    expect(runs[0]).toMatchObject({
      label: "Baseline 7 psi",
      ranOn: "2026-11-20",
      boostTarget: 7,
      boostUnit: "psi",
      torqueUnit: "lbf·ft",
      notes: "Baffle in",
    });
    expect(runs[0].points).toEqual([
      { rpm: 4000, torque: 58.5 },
      { rpm: 5000, torque: 66.25 },
      { rpm: 6000, torque: 70 },
    ]);
  });

  it("a bad CSV gets row-and-column errors and nothing is saved", async () => {
    const fx = await createShopFixture(db);
    await importDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, {
      ...fields,
      curve: {
        source: "table",
        torqueUnit: "N·m",
        rows: [
          { rpm: "4000", torque: "80" },
          { rpm: "5000", torque: "90" },
        ],
      },
    });
    const before = await counts(fx.workOrderId);
    const csv = "rpm,torque_nm\n4000,80\n5000,ninety\n3500,85\n";
    const r = await importDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, { ...fields, curve: { source: "csv", text: csv } });
    expect(r).toEqual({
      ok: false,
      status: 400,
      issues: [
        { path: "curve.3.torque_nm", message: 'Torque must be a number; got "ninety"' },
        { path: "curve.4.rpm", message: expect.stringContaining("must rise") },
      ],
    });
    expect(await counts(fx.workOrderId)).toEqual(before);
    expect(before).toEqual({ runs: 1, points: 2 });
  });

  it("bad fields are refused with field messages and nothing is saved", async () => {
    const fx = await createShopFixture(db);
    const r = await importDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, {
      ...fields,
      ranOn: "20/11/2026",
      curve: { source: "csv", text: "rpm,torque_nm\n4000,80\n5000,90\n" },
    });
    expect(r).toEqual({ ok: false, status: 400, issues: [{ path: "ranOn", message: "Date must be a date (YYYY-MM-DD)." }] });
    expect(await counts(fx.workOrderId)).toEqual({ runs: 0, points: 0 });
  });

  it("a failure while writing points leaves no half-saved run (one transaction)", async () => {
    const fx = await createShopFixture(db);
    await expect(
      saveDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, {
        label: "Broken",
        ranOn: "2026-11-21",
        boostTarget: 7,
        boostUnit: "psi",
        pressureKpa: 100,
        temperatureC: 20,
        humidityPercent: 50,
        standard: "SAE_J1349",
        notes: "",
        source: "table",
        torqueUnit: "N·m",
        // rpm 0 passes no check in the database (rpm > 0): the second insert fails
        points: [
          { rpm: 4000, torque: 80, torqueNm: 80 },
          { rpm: 0, torque: 90, torqueNm: 90 },
        ],
      }),
    ).rejects.toThrow(/dyno_points/);
    expect(await counts(fx.workOrderId)).toEqual({ runs: 0, points: 0 });
  });

  it("another shop's work order is not found and gets nothing", async () => {
    const mine = await createShopFixture(db);
    const theirs = await createShopFixture(db);
    const r = await importDynoRun(db, mine.shopId, theirs.workOrderId, mine.users.mechanic.id, {
      ...fields,
      curve: { source: "csv", text: "rpm,torque_nm\n4000,80\n5000,90\n" },
    });
    expect(r).toEqual({ ok: false, status: 404 });
    expect(await counts(theirs.workOrderId)).toEqual({ runs: 0, points: 0 });
    expect(await listDynoRuns(db, mine.shopId, theirs.workOrderId)).toEqual([]);
  });
});
