import { describe, expect, it } from "vitest";
import { createTemplateVersion } from "@/db/templates/versions";
import { bottomEndTemplate } from "@/lib/procedures/demo-templates/bottom-end";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

describe("template versions", () => {
  it("writes a new version on every save and keeps the old one", async () => {
    const fx = await createShopFixture(db);
    const again = await createTemplateVersion(db, fx.shopId, { ...bottomEndTemplate, name: "Bottom end v2" }, fx.users.office.id);
    expect(again.version).toBe(2);
    expect(again.templateId).toBe(fx.templates.bottom.templateId);
    const versions = await db
      .selectFrom("template_versions")
      .select(["version", "name"])
      .where("template_id", "=", again.templateId)
      .orderBy("version")
      .execute();
    expect(versions.map((v) => v.version)).toEqual([1, 2]);
    expect(versions[0].name).toBe(bottomEndTemplate.name);
  });

  it("rejects a bad document whole, writing nothing", async () => {
    const fx = await createShopFixture(db);
    const before = await db
      .selectFrom("template_versions")
      .select((eb) => eb.fn.countAll<number>().as("n"))
      .executeTakeFirstOrThrow();
    const bad = structuredClone(bottomEndTemplate);
    bad.stages[0].steps[0].measurements![0].min = 99;
    await expect(createTemplateVersion(db, fx.shopId, bad, null)).rejects.toThrow(/min must not exceed max/);
    const after = await db
      .selectFrom("template_versions")
      .select((eb) => eb.fn.countAll<number>().as("n"))
      .executeTakeFirstOrThrow();
    expect(Number(after.n)).toBe(Number(before.n));
  });
});
