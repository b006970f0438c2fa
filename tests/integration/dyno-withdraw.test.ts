import { describe, expect, it } from "vitest";
import { importDynoRun } from "@/db/records/dyno-import";
import { listDynoWorkOrders, listDynoRuns, withdrawDynoRun } from "@/db/records/dyno";
import { loadHandoverReport } from "@/db/records/handover-report";
import { runWithdrawalSchema } from "@/lib/dyno";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

// Invented runs on the fixture shop's work order.
const run = (label: string) => ({
  label,
  ranOn: "2026-11-28",
  boostTarget: "9",
  boostUnit: "psi",
  pressureKpa: "100.8",
  temperatureC: "18",
  humidityPercent: "60",
  standard: "SAE_J1349",
  notes: "",
  curve: { source: "csv", text: "rpm,torque_nm\n5000,80\n7000,95\n9000,90\n" },
});
const reason = (text: string) => runWithdrawalSchema.parse({ reason: text });

describe("withdrawing a dyno run recorded by mistake", () => {
  it("keeps the run on record, marked with who, when and why; it leaves the counts and the build report; the audit log has it", async () => {
    const fx = await createShopFixture(db);
    const sup = { id: fx.users.supervisor.id, shopId: fx.shopId };
    const good = await importDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, run("9 psi, second pull"));
    const bad = await importDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, run("9 psi, wrong weather"));
    if (!good.ok || !bad.ok) throw new Error("fixture runs refused");

    const r = await withdrawDynoRun(db, sup, fx.workOrderId, bad.id, reason("Air temperature typed as 18 instead of 28"));
    expect(r).toEqual({ ok: true, runId: bad.id, closedJob: false });

    const runs = await listDynoRuns(db, fx.shopId, fx.workOrderId);
    expect(runs.map((x) => [x.label, x.withdrawn?.reason ?? null, x.withdrawn?.byName ?? null])).toEqual([
      ["9 psi, second pull", null, null],
      ["9 psi, wrong weather", "Air temperature typed as 18 instead of 28", fx.users.supervisor.name],
    ]);
    expect(runs[1].points).toHaveLength(3); // the curve stays on record

    const job = (await listDynoWorkOrders(db, fx.shopId)).find((j) => j.id === fx.workOrderId);
    expect(Number(job?.runCount)).toBe(1);
    const report = await loadHandoverReport(db, fx.shopId, fx.workOrderId);
    expect(report?.runs.map((x) => x.label)).toEqual(["9 psi, second pull"]);

    const audit = await db
      .selectFrom("audit_log")
      .selectAll()
      .where("action", "=", "dyno.run-withdrawn")
      .where("work_order_id", "=", fx.workOrderId)
      .execute();
    expect(audit).toEqual([
      expect.objectContaining({
        actor_id: sup.id,
        entity: "dyno_run",
        entity_id: bad.id,
        work_order_id: fx.workOrderId,
        outcome: "accepted",
        reason: "Air temperature typed as 18 instead of 28",
      }),
    ]);
  });

  it("the first withdrawal stands: a second one is refused (409) and logged as refused; the reason is not changed", async () => {
    const fx = await createShopFixture(db);
    const office = { id: fx.users.office.id, shopId: fx.shopId };
    const made = await importDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, run("Clutch slipping"));
    if (!made.ok) throw new Error("fixture run refused");
    await withdrawDynoRun(db, office, fx.workOrderId, made.id, reason("Clutch slipped on the pull"));
    const again = await withdrawDynoRun(db, office, fx.workOrderId, made.id, reason("Some other reason"));
    expect(again).toEqual({ ok: false, status: 409, reason: "This run was already withdrawn." });
    const [stored] = await listDynoRuns(db, fx.shopId, fx.workOrderId);
    expect(stored.withdrawn?.reason).toBe("Clutch slipped on the pull");
    const outcomes = await db
      .selectFrom("audit_log")
      .select("outcome")
      .where("entity_id", "=", made.id)
      .where("action", "=", "dyno.run-withdrawn")
      .orderBy("id")
      .execute();
    expect(outcomes.map((o) => o.outcome)).toEqual(["accepted", "refused"]);
  });

  it("another shop's run, or a run of another work order, is not found and stays as it was", async () => {
    const fx = await createShopFixture(db);
    const other = await createShopFixture(db);
    const made = await importDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, run("Keep me"));
    if (!made.ok) throw new Error("fixture run refused");
    const foreign = await withdrawDynoRun(
      db,
      { id: other.users.supervisor.id, shopId: other.shopId },
      fx.workOrderId,
      made.id,
      reason("Not yours to withdraw"),
    );
    expect(foreign).toMatchObject({ ok: false, status: 404 });
    const wrongJob = await withdrawDynoRun(
      db,
      { id: fx.users.supervisor.id, shopId: fx.shopId },
      other.workOrderId,
      made.id,
      reason("Wrong job given"),
    );
    expect(wrongJob).toMatchObject({ ok: false, status: 404 });
    expect((await listDynoRuns(db, fx.shopId, fx.workOrderId))[0].withdrawn).toBeNull();
  });
});
