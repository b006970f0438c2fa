import type { Kysely } from "kysely";
import type { Database } from "../schema";
import { insertDemoQuote, type DemoQuoteLine } from "./demo-quote";

// Office records for the invented demo workshop: quotes, deposits, parts with batches, notes,
// one final invoice. Called from seedDemoShop after the work orders exist.

const QUOTES: Record<number, { status: "sent" | "approved"; lines: DemoQuoteLine[]; deposit: number; paid: boolean }> = {
  1001: {
    status: "approved",
    paid: true,
    deposit: 60000,
    lines: [
      { kind: "part", description: "Forged piston set, 8.5:1", partNumber: "KP-7650-85", qty: 100, price: 64900 },
      { kind: "part", description: "Rod bolt set", partNumber: "RB-8-ARP", qty: 100, price: 11900 },
      { kind: "labour", description: "Strip, measure, rebuild bottom end and head", qty: 1400, price: 6800 },
    ],
  },
  1002: {
    status: "approved",
    paid: true,
    deposit: 15000,
    lines: [
      { kind: "part", description: "Head gasket, multi-layer steel", partNumber: "HG-1052-MLS", qty: 100, price: 8950 },
      { kind: "labour", description: "Head off, check flatness, refit, set valve clearances", qty: 650, price: 6800 },
    ],
  },
  1003: {
    status: "sent",
    paid: false,
    deposit: 25000,
    lines: [
      { kind: "part", description: "Larger intake plenum kit", partNumber: "IP-900-9L", qty: 100, price: 38500 },
      { kind: "part", description: "Exhaust link pipe", partNumber: "EX-LP-900", qty: 100, price: 21000 },
      { kind: "labour", description: "Fit intake and exhaust, dyno tune", qty: 450, price: 6800 },
    ],
  },
  1010: {
    status: "approved",
    paid: true,
    deposit: 5000,
    lines: [
      { kind: "part", description: "Valve cover gasket", partNumber: "VC-900-G", qty: 100, price: 2450 },
      { kind: "labour", description: "Check and set valve clearances, inspect the head", qty: 300, price: 6800 },
    ],
  },
  1005: {
    status: "approved",
    paid: true,
    deposit: 5000,
    lines: [
      { kind: "part", description: "Oil filter", partNumber: "OF-204", qty: 100, price: 1295 },
      { kind: "part", description: "Engine oil 10W-40, litres", partNumber: "OIL-1040", qty: 350, price: 1150 },
      { kind: "labour", description: "Annual service and dyno check", qty: 250, price: 6800 },
    ],
  },
};

export async function seedDemoOffice(db: Kysely<Database>, shopId: string, officeUserId: string, mechanicId: string): Promise<void> {
  const shop = await db.selectFrom("shops").select(["tax_rate_bp", "currency"]).where("id", "=", shopId).executeTakeFirstOrThrow();
  const orders = await db.selectFrom("work_orders").select(["id", "number"]).where("shop_id", "=", shopId).execute();
  const idOf = (n: number) => orders.find((o) => o.number === n)!.id;
  // The sign-in of the bike's owner, when they have one (approvals are theirs).
  const ownerUser = async (workOrderId: string) =>
    (
      await db
        .selectFrom("work_orders as w")
        .innerJoin("bikes as b", "b.id", "w.bike_id")
        .leftJoin("users as u", "u.customer_id", "b.customer_id")
        .select("u.id")
        .where("w.id", "=", workOrderId)
        .executeTakeFirst()
    )?.id ?? null;

  for (const [num, q] of Object.entries(QUOTES)) {
    const workOrderId = idOf(Number(num));
    const { id: quoteId, totals: t } = await insertDemoQuote(db, {
      shop: { id: shopId, ...shop },
      workOrderId,
      status: q.status,
      lines: q.lines,
      depositMinor: q.deposit,
      createdBy: officeUserId,
      approvedBy: q.status === "approved" ? await ownerUser(workOrderId) : null,
    });
    if (q.paid) {
      await db
        .insertInto("deposits")
        .values({
          shop_id: shopId,
          work_order_id: workOrderId,
          quote_id: quoteId,
          amount_minor: q.deposit,
          currency: shop.currency,
          payment_intent_id: `pi_demo_${num}`,
          status: "paid",
          paid_at: new Date(),
        })
        .execute();
    }
    if (Number(num) === 1005) {
      await db
        .insertInto("invoices")
        .values({
          shop_id: shopId,
          work_order_id: workOrderId,
          quote_id: quoteId,
          number: 5001,
          currency: shop.currency,
          subtotal_minor: t.subtotalMinor,
          tax_minor: t.taxMinor,
          total_minor: t.totalMinor,
          deposits_paid_minor: q.deposit,
          balance_due_minor: t.totalMinor - q.deposit,
          created_by: officeUserId,
        })
        .execute();
    }
  }

  // Parts with batches: the same piston-ring batch went into two bikes (for the batch search).
  const parts: Array<{ wo: number; part: string; desc: string; supplier: string; serial?: string; batch?: string; qty?: number }> = [
    { wo: 1001, part: "KP-7650-85", desc: "Forged piston, 76.00 mm", supplier: "Kestrel Performance", batch: "KP-24-1187", qty: 4 },
    { wo: 1001, part: "RS-76-TOP", desc: "Top ring set, boost gap", supplier: "Kestrel Performance", batch: "RS-24-0412", qty: 4 },
    { wo: 1001, part: "RB-8-ARP", desc: "Rod bolt", supplier: "Fenwick Fasteners", batch: "FF-8812", qty: 8 },
    { wo: 1002, part: "HG-1052-MLS", desc: "Head gasket", supplier: "Aldgate Gaskets", serial: "AG-552901" },
    { wo: 1005, part: "RS-76-TOP", desc: "Top ring set", supplier: "Kestrel Performance", batch: "RS-24-0412", qty: 4 },
  ];
  for (const p of parts) {
    await db
      .insertInto("parts_fitted")
      .values({
        shop_id: shopId,
        work_order_id: idOf(p.wo),
        step_id: null,
        part_number: p.part,
        description: p.desc,
        supplier: p.supplier,
        serial: p.serial ?? null,
        batch: p.batch ?? null,
        quantity: p.qty ?? 1,
        fitted_by: mechanicId,
      })
      .execute();
  }

  const notes: Array<{ wo: number; kind: "intake" | "teardown"; body: string }> = [
    {
      wo: 1001,
      kind: "teardown",
      body: "Cylinder 2 piston crown eroded at the exhaust side; top ring land cracked. Bores within limits after hone.",
    },
    { wo: 1002, kind: "teardown", body: "Head gasket breached between cylinder 3 and the water jacket; head flat within 0.03 mm." },
    { wo: 1004, kind: "intake", body: "Tapping noise from the cam cover when warm." },
  ];
  for (const n of notes)
    await db
      .insertInto("work_order_notes")
      .values({ shop_id: shopId, work_order_id: idOf(n.wo), kind: n.kind, body: n.body, author_id: officeUserId })
      .execute();
}
