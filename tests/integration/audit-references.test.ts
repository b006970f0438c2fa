import { randomUUID } from "node:crypto";
import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { appendAudit } from "@/db/audit/append";
import { appendAuditBatch } from "@/db/sync/write";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// The audit log's shop, actor and work order are checked once per statement (migration 150), not
// by row-level foreign keys: an entry naming something that does not exist still fails its whole
// statement with foreign_key_violation (23503), for every writer, and a shop, user or work order
// the log names can still be neither deleted nor given another id.
const db = useTestDb();

const entry = (shopId: string | null, actorId: string | null, workOrderId: string | null, n: number) => ({
  shopId,
  actorId,
  workOrderId,
  action: "test.references",
  entity: "test",
  entityId: String(n),
  outcome: "accepted" as const,
});

const countOf = async (entityId: string) =>
  (
    await sql<{ n: number }>`SELECT count(*)::int AS n FROM audit_log WHERE action = 'test.references' AND entity_id = ${entityId}`.execute(
      db,
    )
  ).rows[0].n;

describe("audit log references", () => {
  it("takes entries naming a shop, user and work order on file, and entries naming none", async () => {
    const fx = await createShopFixture(db);
    await appendAudit(db, [entry(fx.shopId, fx.users.office.id, fx.workOrderId, 1001), entry(null, null, null, 1002)]);
    await db.transaction().execute((trx) => appendAuditBatch(trx, [entry(fx.shopId, fx.users.mechanic.id, fx.workOrderId, 1003)]));
    expect([await countOf("1001"), await countOf("1002"), await countOf("1003")]).toEqual([1, 1, 1]);
  });

  it.each([
    [
      "shop",
      (fx: { shopId: string; users: { office: { id: string } }; workOrderId: string }) =>
        entry(randomUUID(), fx.users.office.id, fx.workOrderId, 2001),
    ],
    [
      "user",
      (fx: { shopId: string; users: { office: { id: string } }; workOrderId: string }) =>
        entry(fx.shopId, randomUUID(), fx.workOrderId, 2001),
    ],
    [
      "work order",
      (fx: { shopId: string; users: { office: { id: string } }; workOrderId: string }) =>
        entry(fx.shopId, fx.users.office.id, randomUUID(), 2001),
    ],
  ])(
    "refuses a statement with one entry naming a %s that does not exist, by INSERT or by COPY: nothing of it is saved",
    async (what, bad) => {
      const fx = await createShopFixture(db);
      const good = entry(fx.shopId, fx.users.office.id, fx.workOrderId, 2000);
      const wrong = bad(fx);
      await expect(appendAudit(db, [good, wrong])).rejects.toMatchObject({
        code: "23503",
        message: `audit_log names a ${what} that does not exist`,
      });
      await expect(db.transaction().execute((trx) => appendAuditBatch(trx, [good, wrong]))).rejects.toMatchObject({ code: "23503" });
      expect(await countOf("2000")).toBe(0);
      expect(await countOf("2001")).toBe(0);
    },
  );

  it("refuses deleting a user the log names, or changing its id; one it does not name can still go", async () => {
    const fx = await createShopFixture(db);
    const newUser = async (name: string) =>
      (
        await db
          .insertInto("users")
          .values({ shop_id: fx.shopId, email: `${name}-${randomUUID()}@fixture.test`, name, role: "office", password_hash: "x" })
          .returning("id")
          .executeTakeFirstOrThrow()
      ).id;
    // users nothing but the log names (a fixture's users are named by other tables' foreign keys too)
    const named = await newUser("Named");
    const loose = await newUser("Loose");
    await appendAudit(db, [entry(fx.shopId, named, null, 3000)]);
    await expect(sql`DELETE FROM users WHERE id = ${named}::uuid`.execute(db)).rejects.toMatchObject({
      code: "23503",
      message: `users ${named} is named by the audit log: DELETE refused`,
    });
    await expect(sql`UPDATE users SET id = ${randomUUID()}::uuid WHERE id = ${named}::uuid`.execute(db)).rejects.toMatchObject({
      code: "23503",
      message: `users ${named} is named by the audit log: UPDATE refused`,
    });
    // other changes of a named row go on as before
    await sql`UPDATE users SET name = ${"Renamed"} WHERE id = ${named}::uuid`.execute(db);
    // a user the log does not name can still be deleted (the rule is the foreign key's, no stricter)
    await sql`DELETE FROM users WHERE id = ${loose}::uuid`.execute(db);
    const left = await db.selectFrom("users").select(["id", "name"]).where("id", "in", [named, loose]).execute();
    expect(left).toEqual([{ id: named, name: "Renamed" }]);
  });
});
