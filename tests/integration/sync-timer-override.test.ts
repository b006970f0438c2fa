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
    const why =
      "Only a supervisor may override a timer. Ask the office to give you the supervisor role and send it again, or discard it with a reason.";
    expect(res.refused).toEqual([{ id: override.id, reason: why }]);
    const t = await db.selectFrom("timers").select(["override_by", "override_reason"]).where("id", "=", timerId).executeTakeFirstOrThrow();
    expect(t).toEqual({ override_by: null, override_reason: null });
    const audit = await db.selectFrom("audit_log").select(["outcome", "reason"]).where("entity_id", "=", override.id).execute();
    expect(audit).toEqual([{ outcome: "refused", reason: why }]);
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

  it("an override of a timer not on file yet is held, and applied when the timer's start arrives", async () => {
    const { mech, sup, mechTablet, supTablet, timerId, start } = await setup();
    const op = supTablet.make("timer.overridden", { timerId, reason: "Fast-cure sealant used" });
    const held = await mergeBatch(db, sup, supTablet.batch([op]));
    expect(held).toMatchObject({
      accepted: [],
      refused: [],
      pending: [{ id: op.id, reason: expect.stringContaining(`timer ${timerId}`) }],
    });
    expect(await db.selectFrom("operations").select("id").where("id", "=", op.id).execute()).toEqual([]);
    // sent again meanwhile: still held, not held twice
    expect((await mergeBatch(db, sup, supTablet.batch([op]))).pending.map((p) => p.id)).toEqual([op.id]);

    const res = await mergeBatch(db, mech, mechTablet.batch([start]));
    expect(res.accepted).toEqual([start.id]);
    const t = await db.selectFrom("timers").select(["override_by", "override_reason"]).where("id", "=", timerId).executeTakeFirstOrThrow();
    expect(t).toEqual({ override_by: sup.id, override_reason: "Fast-cure sealant used" });
    // audited under the supervisor who made it, not the mechanic whose batch brought the timer
    const audit = await db.selectFrom("audit_log").select(["actor_id", "outcome"]).where("entity_id", "=", op.id).execute();
    expect(audit).toEqual([{ actor_id: sup.id, outcome: "accepted" }]);
    // the supervisor's tablet learns it on its next send
    expect((await mergeBatch(db, sup, supTablet.batch([op]))).duplicates).toEqual([op.id]);
  });

  it("an override of a timer on another job is refused", async () => {
    const { sup, supTablet, mech, mechTablet, start } = await setup();
    await mergeBatch(db, mech, mechTablet.batch([start]));
    const other = await createShopFixture(db);
    const elsewhere = new Tablet(supTablet.deviceId, sup.id, other.workOrderId);
    const op = elsewhere.make("timer.overridden", { timerId: start.payload.timerId, reason: "wrong job" });
    const res = await mergeBatch(db, sup, elsewhere.batch([op]));
    expect(res.refused[0]?.reason).toMatch(/not in your shop|is not on record/);
  });
});
