import { randomUUID } from "node:crypto";
import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// Merges of two shops do not share a lock. When another shop's transaction stores an operation id
// while this shop's merge is writing the same id, the merge's COPY is refused by the primary key:
// nothing of the batch is saved, and the tablet's next send is told the id is taken (rule 2).
const db = useTestDb();

const countRows = async (table: string, workOrderId: string) =>
  (await sql<{ n: number }>`SELECT count(*)::int AS n FROM ${sql.table(table)} WHERE work_order_id = ${workOrderId}::uuid`.execute(db))
    .rows[0].n;

/** Waits until a COPY into operations waits for a lock (the merge blocked on the other shop's uncommitted id). */
async function someoneWaitsForALock(): Promise<void> {
  for (let i = 0; i < 600; i++) {
    const r = await sql<{ n: number }>`
      SELECT count(*)::int AS n FROM pg_stat_activity
      WHERE datname = current_database() AND wait_event_type = 'Lock' AND query LIKE ${'%COPY "operations"%'}`.execute(db);
    if (r.rows[0].n > 0) return;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error("no session waited for a lock");
}

describe("an operation id stored by another shop while this shop's merge writes it", () => {
  it("saves nothing of the batch; the next send refuses that id and stores the rest", async () => {
    const a = await createShopFixture(db);
    const b = await createShopFixture(db);
    const specs = await fixtureSpecs(db, a);
    const mech: SessionUser = { ...a.users.mechanic, customerId: null };
    const tablet = new Tablet(`race-${randomUUID().slice(0, 6)}`, mech.id, a.workOrderId);
    const ops = [
      tablet.read(specs.boreStepId, specs.boreSpecId, 0, "76.004"),
      tablet.bolt(specs.rodStepId, specs.rodSpecId, 1, 1),
      tablet.complete(specs.rodStepId),
    ];
    const taken = ops[1].id;

    let releaseOther!: () => void;
    const otherMayCommit = new Promise<void>((resolve) => (releaseOther = resolve));
    let otherHasWritten!: () => void;
    const otherWrote = new Promise<void>((resolve) => (otherHasWritten = resolve));
    const other = db.transaction().execute(async (trx) => {
      await sql`INSERT INTO operations (id, shop_id, work_order_id, kind, author_id, device_id, device_time, stamp, payload)
        VALUES (${taken}::uuid, ${b.shopId}::uuid, ${b.workOrderId}::uuid, 'step.completed', ${b.users.mechanic.id}::uuid, 'other-shop',
          now(), ${ops[1].stamp}, ${JSON.stringify({ stepId: specs.rodStepId })}::jsonb)`.execute(trx);
      otherHasWritten();
      await otherMayCommit;
    });
    await otherWrote;

    const merging = mergeBatch(db, mech, tablet.batch(ops));
    const outcome = merging.then(
      () => "saved",
      (e: Error) => e.message,
    );
    await someoneWaitsForALock();
    releaseOther();
    await other;

    expect(await outcome).toMatch(/operations_pkey|duplicate key/);
    expect(await countRows("operations", a.workOrderId)).toBe(0);
    expect(await countRows("measurements", a.workOrderId)).toBe(0);
    expect(await countRows("audit_log", a.workOrderId)).toBe(0);

    const again = await mergeBatch(db, mech, tablet.batch(ops));
    expect(again.refused).toEqual([{ id: taken, reason: expect.stringContaining("already used by another user's operation") }]);
    expect(new Set(again.accepted)).toEqual(new Set([ops[0].id, ops[2].id]));
    expect(await countRows("operations", a.workOrderId)).toBe(2);
    expect(await countRows("measurements", a.workOrderId)).toBe(1);
    expect(await countRows("step_completions", a.workOrderId)).toBe(1);
  });
});
