import bcrypt from "bcryptjs";
import type { Kysely } from "kysely";
import { quoteTotals } from "@/lib/money/quote-totals";
import type { Database } from "../schema";
import { DEMO_PASSWORD } from "./demo-people";
import { insertDemoBike } from "./demo-bike";
import { demoUserId, firstTemplateVersionId } from "./demo-lookups";

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
  const shop = await db.selectFrom("shops").select(["tax_rate_bp", "currency"]).where("id", "=", shopId).executeTakeFirstOrThrow();
  const totals = quoteTotals(
    LINES.map((l) => ({ quantityHundredths: l.qty, unitPriceMinor: l.price })),
    shop.tax_rate_bp,
  );
  for (const b of BIKES) {
    const bikeId = await insertDemoBike(db, shopId, customer.id, b);
    const wo = await db
      .insertInto("work_orders")
      .values({
        shop_id: shopId,
        bike_id: bikeId,
        number: b.number,
        title: "Bottom-end rebuild after a spun bearing",
        status: "in_build",
        complaint: "Knock from the bottom end under load; wants it rebuilt.",
        intake_odometer_km: 30_000 + b.number,
        assigned_mechanic_id: tomasId,
        closed_at: null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await db
      .insertInto("work_order_transitions")
      .values({ work_order_id: wo.id, from_status: null, to_status: "in_build", by_user_id: officeId, note: "demo data" })
      .execute();
    await db.insertInto("job_procedures").values({ work_order_id: wo.id, template_version_id: bottomEndVersionId, position: 0 }).execute();
    const quote = await db
      .insertInto("quotes")
      .values({
        shop_id: shopId,
        work_order_id: wo.id,
        version: 1,
        status: "approved",
        currency: shop.currency,
        tax_rate_bp: shop.tax_rate_bp,
        subtotal_minor: totals.subtotalMinor,
        tax_minor: totals.taxMinor,
        total_minor: totals.totalMinor,
        deposit_minor: DEPOSIT,
        created_by: officeId,
        sent_at: new Date(),
        approved_at: new Date(),
        approved_by: null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await db
      .insertInto("quote_lines")
      .values(
        LINES.map((l, i) => ({
          quote_id: quote.id,
          position: i,
          kind: l.kind,
          description: l.description,
          part_number: l.partNumber,
          quantity_hundredths: l.qty,
          unit_price_minor: l.price,
          line_total_minor: totals.lineTotals[i],
        })),
      )
      .execute();
    await db
      .insertInto("deposits")
      .values({
        shop_id: shopId,
        work_order_id: wo.id,
        quote_id: quote.id,
        amount_minor: DEPOSIT,
        currency: shop.currency,
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
        work_order_id: wo.id,
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
