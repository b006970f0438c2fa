import bcrypt from "bcryptjs";
import type { Kysely } from "kysely";
import type { Database } from "../schema";
import { DEMO_PASSWORD } from "./demo-people";
import { insertDemoBike } from "./demo-bike";
import { demoUserId, firstTemplateVersionId } from "./demo-lookups";
import { insertQuotedDemoJob } from "./demo-quoted-job";

// Invented jobs for extra work and the final bill (and the browser test of them): work orders
// 1073–1074, tags GSW-1073…GSW-1074, bikes of the invented customer Wren Ashby (who signs in as
// wren.ashby@example.test, demo password), in build on the demo bottom-end procedure, each with an
// approved quote (3.50 h labour and a bearing set) and its deposit of 100.00 paid.
// - 1073: the browser test writes extra work on it, Wren answers, the bill is issued and paid;
// - 1074: the same, kept for trying by hand.

export const EXTRA_WORK_CUSTOMER = { name: "Wren Ashby", email: "wren.ashby@example.test" } as const;

const BIKES = [
  { number: 1073, tag: "GSW-1073", make: "Pelham", model: "Scarp 800", year: 2016, cc: 798, colour: "Orange" },
  { number: 1074, tag: "GSW-1074", make: "Oxmoor", model: "Vane 650", year: 2019, cc: 649, colour: "White" },
] as const;

const LINES = [
  { kind: "labour" as const, description: "Strip, measure and rebuild the bottom end", partNumber: null, qty: 350, price: 6800 },
  { kind: "part" as const, description: "Main and big-end bearing shells", partNumber: "GS-BRG-SET", qty: 100, price: 14500 },
];
const DEPOSIT = 10_000;

/** Whether jobs 1073–1074 are on file (a database seeded before they existed gets them on the next seed). */
export async function demoExtraWorkExists(db: Kysely<Database>, shopId: string): Promise<boolean> {
  const row = await db.selectFrom("work_orders").select("id").where("shop_id", "=", shopId).where("number", "=", 1073).executeTakeFirst();
  return Boolean(row);
}

export async function seedDemoExtraWork(db: Kysely<Database>, shopId: string): Promise<void> {
  const officeId = await demoUserId(db, shopId, "maren@gannet-street.test");
  const tomasId = await demoUserId(db, shopId, "tomas@gannet-street.test");
  const bottomEndVersionId = await firstTemplateVersionId(db, shopId, "bottom-end-assembly");
  const customer = await db
    .insertInto("customers")
    .values({ shop_id: shopId, name: EXTRA_WORK_CUSTOMER.name, email: EXTRA_WORK_CUSTOMER.email, phone: "+44 20 7946 0173" })
    .returning("id")
    .executeTakeFirstOrThrow();
  await db
    .insertInto("users")
    .values({
      shop_id: shopId,
      email: EXTRA_WORK_CUSTOMER.email,
      name: EXTRA_WORK_CUSTOMER.name,
      role: "customer",
      password_hash: await bcrypt.hash(DEMO_PASSWORD, 10),
      customer_id: customer.id,
    })
    .execute();
  for (const b of BIKES) {
    const bikeId = await insertDemoBike(db, shopId, customer.id, b);
    const { workOrderId, quoteId, currency } = await insertQuotedDemoJob(db, {
      shopId,
      bikeId,
      number: b.number,
      title: "Bottom-end rebuild after a spun bearing",
      complaint: "Knock from the bottom end under load; wants it rebuilt.",
      odometerKm: 30_000 + b.number,
      mechanicId: tomasId,
      officeId,
      templateVersionId: bottomEndVersionId,
      lines: LINES,
      depositMinor: DEPOSIT,
    });
    await db
      .insertInto("deposits")
      .values({
        shop_id: shopId,
        work_order_id: workOrderId,
        quote_id: quoteId,
        amount_minor: DEPOSIT,
        currency,
        status: "paid",
        payment_intent_id: null,
        paid_at: new Date(),
      })
      .execute();
    // an oil filter fitted at the bench that no quote line names: offered for the bill
    await db
      .insertInto("parts_fitted")
      .values({
        shop_id: shopId,
        work_order_id: workOrderId,
        step_id: null,
        part_number: "GS-OF-204",
        description: "Oil filter",
        serial: null,
        batch: "B-2611",
        quantity: 1,
        fitted_by: officeId,
      })
      .execute();
  }
}
