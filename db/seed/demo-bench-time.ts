import { randomUUID } from "node:crypto";
import type { Kysely } from "kysely";
import { quoteTotals } from "@/lib/money/quote-totals";
import { formatStamp } from "@/lib/sync/hlc";
import type { Database } from "../schema";
import { mergeBatch } from "../sync/merge";
import { insertDemoBike } from "./demo-bike";
import { demoBottomEndJobBasics } from "./demo-late-work";

// Two invented jobs for time at the bench (and the browser tests of it): work orders 1060–1061,
// tags GSW-0060…GSW-0061, in build on the demo bottom-end procedure, each with an approved quote
// whose labour lines give the hours to compare the clocked time with.
// - 1060: assigned to Tomas Reyes, nobody has clocked on yet (the browser test clocks on and off);
// - 1061: assigned to Priya Vance, who clocked on yesterday morning and never clocked off — the
//   clock a supervisor closes with a reason.

const BIKES = [
  { number: 1060, tag: "GSW-0060", make: "Brackwater", model: "Fell 700", year: 2018, cc: 689, colour: "Grey", mechanic: "tomas" },
  { number: 1061, tag: "GSW-0061", make: "Tarrant", model: "Ridge 1100", year: 2013, cc: 1098, colour: "Teal", mechanic: "priya" },
] as const;

const LABOUR = [
  { kind: "labour" as const, description: "Strip, measure and rebuild the bottom end", qty: 350, price: 6800 },
  { kind: "part" as const, description: "Main and big-end bearing shells", partNumber: "GS-BRG-SET", qty: 100, price: 14500 },
];

const DEVICE = "demo-tablet-6";

/** Whether jobs 1060–1061 are on file (a database seeded before they existed gets them on the next seed). */
export async function demoBenchTimeExists(db: Kysely<Database>, shopId: string): Promise<boolean> {
  const row = await db.selectFrom("work_orders").select("id").where("shop_id", "=", shopId).where("number", "=", 1060).executeTakeFirst();
  return Boolean(row);
}

/** Writes jobs 1060–1061 for the demo shop, with their quotes and Priya's forgotten clock on 1061. */
export async function seedDemoBenchTime(db: Kysely<Database>, shopId: string): Promise<void> {
  const user = async (email: string) =>
    db
      .selectFrom("users")
      .select(["id", "name", "email"])
      .where("shop_id", "=", shopId)
      .where("email", "=", email)
      .executeTakeFirstOrThrow();
  const office = await user("maren@gannet-street.test");
  const people = { tomas: await user("tomas@gannet-street.test"), priya: await user("priya@gannet-street.test") };
  const { customerId, bottomEndVersionId } = await demoBottomEndJobBasics(db, shopId);
  const shop = await db.selectFrom("shops").select(["tax_rate_bp", "currency"]).where("id", "=", shopId).executeTakeFirstOrThrow();
  const totals = quoteTotals(
    LABOUR.map((l) => ({ quantityHundredths: l.qty, unitPriceMinor: l.price })),
    shop.tax_rate_bp,
  );
  const jobs: Record<number, string> = {};
  for (const b of BIKES) {
    const bikeId = await insertDemoBike(db, shopId, customerId, b);
    const wo = await db
      .insertInto("work_orders")
      .values({
        shop_id: shopId,
        bike_id: bikeId,
        number: b.number,
        title: "Bottom-end rebuild, bearings and a measured build",
        status: "in_build",
        complaint: "Rumble from the bottom end at idle; wants it rebuilt with the clearances written down.",
        intake_odometer_km: 40_000 + b.number,
        assigned_mechanic_id: people[b.mechanic].id,
        closed_at: null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    jobs[b.number] = wo.id;
    await db
      .insertInto("work_order_transitions")
      .values({ work_order_id: wo.id, from_status: null, to_status: "in_build", by_user_id: office.id, note: "demo data" })
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
        deposit_minor: 0,
        created_by: office.id,
        sent_at: new Date(),
        approved_at: new Date(),
        approved_by: null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await db
      .insertInto("quote_lines")
      .values(
        LABOUR.map((l, i) => ({
          quote_id: quote.id,
          position: i,
          kind: l.kind,
          description: l.description,
          part_number: l.kind === "part" ? l.partNumber : null,
          quantity_hundredths: l.qty,
          unit_price_minor: l.price,
          line_total_minor: totals.lineTotals[i],
        })),
      )
      .execute();
  }
  // Priya clocked on 1061 yesterday at 08:10 (server time) and never clocked off.
  const yesterday = new Date();
  yesterday.setDate(yesterday.getDate() - 1);
  yesterday.setHours(8, 10, 0, 0);
  const at = yesterday.getTime();
  const priya = people.priya;
  await mergeBatch(
    db,
    { id: priya.id, shopId, role: "mechanic", name: priya.name, email: priya.email, customerId: null },
    {
      deviceId: DEVICE,
      cursor: null,
      operations: [
        {
          id: randomUUID(),
          kind: "clock.on",
          workOrderId: jobs[1061],
          authorId: priya.id,
          deviceId: DEVICE,
          deviceTime: new Date(at).toISOString(),
          stamp: formatStamp({ wallMs: at, counter: 0, deviceId: DEVICE }),
          payload: { clockId: randomUUID(), startedAt: new Date(at).toISOString() },
        },
      ],
    },
  );
}
