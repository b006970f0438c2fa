import { randomUUID } from "node:crypto";
import bcrypt from "bcryptjs";
import type { Kysely } from "kysely";
import { bottomEndTemplate } from "@/lib/procedures/demo-templates/bottom-end";
import { cylinderHeadTemplate } from "@/lib/procedures/demo-templates/cylinder-head";
import type { WorkOrderStatus } from "@/lib/work-orders/status";
import type { Database } from "@/db/schema";
import type { Role } from "@/lib/auth/roles";
import { createTemplateVersion } from "@/db/templates/versions";

export const FIXTURE_PASSWORD = "fixture-pass-1";
let hashed: string | undefined;

export type ShopFixture = Awaited<ReturnType<typeof createShopFixture>>;

// A self-contained shop with one user of each role (two mechanics), a customer with a bike,
// and a work order running the demo bottom-end and head templates (in build by default).
// Every call makes new rows with unique e-mails and tags, so test files do not collide.
export async function createShopFixture(db: Kysely<Database>, opts: { status?: WorkOrderStatus } = {}) {
  const tag = randomUUID().slice(0, 8);
  hashed ??= await bcrypt.hash(FIXTURE_PASSWORD, 4);
  const shop = await db
    .insertInto("shops")
    .values({ name: `Fixture shop ${tag}`, slug: `fx-${tag}`, tax_rate_bp: 2000 })
    .returning("id")
    .executeTakeFirstOrThrow();
  const customer = await db
    .insertInto("customers")
    .values({ shop_id: shop.id, name: `Customer ${tag}`, email: `c-${tag}@example.test`, phone: "+1 555 0100" })
    .returning("id")
    .executeTakeFirstOrThrow();
  const mk = async (role: Role, name: string) =>
    db
      .insertInto("users")
      .values({
        shop_id: shop.id,
        email: `${name}-${tag}@fixture.test`,
        name: `${name} ${tag}`,
        role,
        password_hash: hashed!,
        customer_id: role === "customer" ? customer.id : null,
      })
      .returning(["id", "email", "role", "shop_id as shopId", "name"])
      .executeTakeFirstOrThrow();
  const users = {
    mechanic: await mk("mechanic", "mech"),
    mechanic2: await mk("mechanic", "mech2"),
    supervisor: await mk("supervisor", "sup"),
    office: await mk("office", "office"),
    customer: await mk("customer", "cust"),
  };
  const bike = await db
    .insertInto("bikes")
    .values({
      shop_id: shop.id,
      customer_id: customer.id,
      make: "Fixture",
      model: "Test 1000",
      year: 2012,
      tag_code: `FX-${tag}`,
      vin: null,
      engine_number: null,
      displacement_cc: 998,
      colour: null,
    })
    .returning(["id", "tag_code"])
    .executeTakeFirstOrThrow();
  const bottom = await createTemplateVersion(db, shop.id, bottomEndTemplate, users.office.id);
  const head = await createTemplateVersion(db, shop.id, cylinderHeadTemplate, users.office.id);
  const workOrder = await db
    .insertInto("work_orders")
    .values({
      shop_id: shop.id,
      bike_id: bike.id,
      number: 1,
      title: "Fixture rebuild",
      status: opts.status ?? "in_build",
      intake_odometer_km: 1000,
      assigned_mechanic_id: users.mechanic.id,
      closed_at: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  const procedures = [];
  for (const [position, v] of [bottom, head].entries()) {
    procedures.push(
      await db
        .insertInto("job_procedures")
        .values({ work_order_id: workOrder.id, template_version_id: v.versionId, position })
        .returning(["id", "template_version_id as templateVersionId"])
        .executeTakeFirstOrThrow(),
    );
  }
  const steps = await db
    .selectFrom("template_steps")
    .select(["id", "key", "stage_key as stageKey", "template_version_id as templateVersionId"])
    .where("template_version_id", "in", [bottom.versionId, head.versionId])
    .execute();
  const stepByKey = Object.fromEntries(steps.map((s) => [s.key, s]));
  return {
    shopId: shop.id,
    customerId: customer.id,
    users,
    bike,
    workOrderId: workOrder.id,
    procedures,
    stepByKey,
    templates: { bottom, head },
  };
}
