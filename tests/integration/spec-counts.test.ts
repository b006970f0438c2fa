import { describe, expect, it } from "vitest";
import { getJobSnapshot } from "@/db/bench/jobs";
import { loadWorkOrderFacts } from "@/db/sync/context";
import { buildWorkOrderView, readingCount } from "@/lib/work-order-record";
import type { SessionUser } from "@/lib/auth/session-user";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// The server's merge checks a reading index or a torque pass against the facts it loads; the
// tablet offers the spots and passes of its job view. For the same job they must be the same
// numbers, or the tablet would offer work the server refuses.
const db = useTestDb();

describe("server and tablet count the same readings and passes", () => {
  it("for every measurement and torque spec pinned on a job", async () => {
    const fx = await createShopFixture(db);
    const mech: SessionUser = { ...fx.users.mechanic, customerId: null };
    const facts = (await loadWorkOrderFacts(db, fx.shopId, [fx.workOrderId])).get(fx.workOrderId)!;
    const snapshot = (await getJobSnapshot(db, mech, fx.workOrderId))!;
    const view = buildWorkOrderView(snapshot, [], Date.now());
    const steps = view.steps;
    const torque = steps.flatMap((s) => s.torque);
    const measurementSpecs = snapshot.procedures.flatMap((p) => p.stages.flatMap((st) => st.steps.flatMap((s) => s.measurementSpecs)));
    expect(torque.length).toBeGreaterThan(0);
    expect(measurementSpecs.length).toBeGreaterThan(0);
    for (const t of torque) expect([t.spec.label, t.passes.length]).toEqual([t.spec.label, facts.torqueSpecs.get(t.spec.id)!.passCount]);
    for (const m of measurementSpecs) expect([m.label, readingCount(m)]).toEqual([m.label, facts.measurementSpecs.get(m.id)!.readingCount]);
  });
});
