import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
const asUser = (u: ShopFixture["users"]["mechanic"]): SessionUser => ({ ...u, role: u.role, customerId: null });

// The demo bottom-end template: once the cases are closed and torqued, a 30-minute cure holds back the oil fill.
describe("overriding a cure timer", () => {
  async function setup() {
    const fx = await createShopFixture(db);
    const specs = await fixtureSpecs(db, fx);
    const mech = asUser(fx.users.mechanic);
    const sup = asUser(fx.users.supervisor);
    const mechTablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId);
    const supTablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, sup.id, fx.workOrderId);
    const timerId = randomUUID();
    const start = mechTablet.make("timer.started", {
      timerId,
      stepId: specs.cureStepId,
      timerSpecId: specs.cureTimerSpecId,
      label: "Sealant cure",
      durationS: 1800,
      startedAt: new Date().toISOString(),
    });
    return { fx, mech, sup, mechTablet, supTablet, timerId, start };
  }

  it("a mechanic may not override: refused with the reason, the timer untouched", async () => {
    const { mech, mechTablet, timerId, start } = await setup();
    await mergeBatch(db, mech, mechTablet.batch([start]));
    const override = mechTablet.make("timer.overridden", { timerId, reason: "in a hurry" });
    const res = await mergeBatch(db, mech, mechTablet.batch([override]));
    expect(res.refused).toEqual([{ id: override.id, reason: "Only a supervisor may override a timer." }]);
    const t = await db.selectFrom("timers").select(["override_by", "override_reason"]).where("id", "=", timerId).executeTakeFirstOrThrow();
    expect(t).toEqual({ override_by: null, override_reason: null });
    const audit = await db.selectFrom("audit_log").select(["outcome", "reason"]).where("entity_id", "=", override.id).execute();
    expect(audit).toEqual([{ outcome: "refused", reason: "Only a supervisor may override a timer." }]);
  });

  it("a supervisor's override of a running timer is stored with who and why; a second one does not replace it", async () => {
    const { mech, sup, mechTablet, supTablet, timerId, start } = await setup();
    await mergeBatch(db, mech, mechTablet.batch([start]));
    const first = supTablet.make("timer.overridden", { timerId, reason: "Fast-cure sealant used; maker allows 10 min" });
    const second = supTablet.make("timer.overridden", { timerId, reason: "second thoughts" });
    expect((await mergeBatch(db, sup, supTablet.batch([first]))).accepted).toEqual([first.id]);
    expect((await mergeBatch(db, sup, supTablet.batch([second]))).accepted).toEqual([second.id]);
    const t = await db.selectFrom("timers").select(["override_by", "override_reason"]).where("id", "=", timerId).executeTakeFirstOrThrow();
    expect(t).toEqual({ override_by: sup.id, override_reason: "Fast-cure sealant used; maker allows 10 min" });
  });

  it("a timer started and overridden in one batch is written already overridden", async () => {
    const fx = await createShopFixture(db);
    const specs = await fixtureSpecs(db, fx);
    const sup = asUser(fx.users.supervisor);
    const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, sup.id, fx.workOrderId);
    const timerId = randomUUID();
    const ops = [
      tablet.make("timer.started", {
        timerId,
        stepId: specs.cureStepId,
        timerSpecId: specs.cureTimerSpecId,
        label: "Sealant cure",
        durationS: 1800,
        startedAt: new Date().toISOString(),
      }),
      tablet.make("timer.overridden", { timerId, reason: "Cases closed yesterday, cure long done" }),
    ];
    const res = await mergeBatch(db, sup, tablet.batch(ops));
    expect(res.refused).toEqual([]);
    const t = await db.selectFrom("timers").select(["override_by", "override_reason"]).where("id", "=", timerId).executeTakeFirstOrThrow();
    expect(t).toEqual({ override_by: sup.id, override_reason: "Cases closed yesterday, cure long done" });
  });

  it("an override of a timer that is not on the job is refused", async () => {
    const { sup, supTablet } = await setup();
    const op = supTablet.make("timer.overridden", { timerId: randomUUID(), reason: "no such timer" });
    const res = await mergeBatch(db, sup, supTablet.batch([op]));
    expect(res.refused[0]?.reason).toMatch(/is not on record/);
  });
});
