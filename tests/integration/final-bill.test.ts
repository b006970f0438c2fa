import { randomUUID } from "node:crypto";
import fc from "fast-check";
import { sql } from "kysely";
import { beforeAll, describe, expect, it } from "vitest";
import { issueBill, issuedBillOf } from "@/db/office/final-bill";
import { answerAsCustomer, writeSupplement } from "@/db/office/supplements";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { formatStamp } from "@/lib/sync/hlc";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { insertQuotedJob } from "./support/quoted-job";
import { useTestDb } from "./support/test-db";

// The final bill on real PostgreSQL. The property: whatever the quote, the extra work, the
// customer's answers, the clocked time, the parts fitted, the deposit, the shop's tax rate and
// the office's choices, the issued bill equals the approved lines by the stated rules (README,
// "The final bill"), recomputed here independently in BigInt arithmetic:
//  - a line = quantity (hundredths) × unit price, half up to the minor unit;
//  - declined and unanswered extra work is listed and not billed;
//  - labour "as clocked" takes a share of the clocked hours in proportion to the quoted hours,
//    the shares adding up to the clocked total, each within one hundredth of its exact share;
//  - tax once on the subtotal, half up (common practice: tax on the invoice total, rounded to the
//    nearest penny, halves up — as a UK VAT invoice may be worked; from memory);
//  - balance = total − deposit paid.

const db = useTestDb();
let fx: ShopFixture;
let office: { id: string };
let customer: SessionUser;
let number = 7000;
let counter = 0;
let clockSlot = 0;

beforeAll(async () => {
  fx = await createShopFixture(db);
  office = fx.users.office;
  customer = { ...fx.users.customer, customerId: fx.customerId };
});

const halfUp = (num: bigint, den: bigint) => (num * 2n + den) / (2n * den);

interface Line {
  kind: "part" | "labour";
  qty: number;
  price: number;
  partNumber: string | null;
}
// realistic ranges (a bill past 100,000,000.00 is refused: tested below)
const lineArb = fc.record({
  kind: fc.constantFrom("part" as const, "labour" as const),
  qty: fc.integer({ min: 1, max: 5_000 }),
  price: fc.integer({ min: 0, max: 2_000_000 }),
  partNumber: fc.option(fc.constantFrom("GS-A1", "GS-B2", "GS-C3"), { nil: null }),
});

async function newJobInBuild(quoteLines: Line[], taxRateBp: number, depositMinor: number) {
  await db.updateTable("shops").set({ tax_rate_bp: taxRateBp }).where("id", "=", fx.shopId).execute();
  const n = ++number;
  const { workOrderId, quoteId } = await insertQuotedJob(db, fx, {
    number: n,
    title: `Bill job ${n}`,
    status: "in_build",
    taxRateBp,
    odometerKm: 1000,
    mechanicId: fx.users.mechanic.id,
    approvedBy: fx.users.customer.id,
  });
  const wo = { id: workOrderId };
  const q = { id: quoteId };
  await db
    .insertInto("quote_lines")
    .values(
      quoteLines.map((l, i) => ({
        quote_id: q.id,
        position: i,
        kind: l.kind,
        description: `Quoted line ${i + 1}`,
        part_number: l.partNumber,
        quantity_hundredths: l.qty,
        unit_price_minor: l.price,
        line_total_minor: 0, // the quote's own figure is not what the bill is made from
      })),
    )
    .execute();
  if (depositMinor > 0)
    await db
      .insertInto("deposits")
      .values({
        shop_id: fx.shopId,
        work_order_id: wo.id,
        quote_id: q.id,
        amount_minor: depositMinor,
        currency: "GBP",
        status: "paid",
        payment_intent_id: null,
        paid_at: new Date(),
      })
      .execute();
  return wo.id;
}

/** A clock of `minutes` on the job, on and off through the sync (a mechanic of the fixture). */
async function clock(jobId: string, minutes: number) {
  const mech: SessionUser = { ...fx.users.mechanic, customerId: null };
  const device = `tab-bill-${jobId.slice(0, 8)}`;
  // each job's clock in a slot of its own, so no clock-on ends another job's clock early
  const start = Date.now() - 2_000 * 3_600_000 + clockSlot++ * 3_000 * 60_000;
  const clockId = randomUUID();
  const op = (kind: "clock.on" | "clock.off", ms: number, payload: Record<string, unknown>) => ({
    id: randomUUID(),
    kind,
    workOrderId: jobId,
    authorId: mech.id,
    deviceId: device,
    deviceTime: new Date(ms).toISOString(),
    stamp: formatStamp({ wallMs: ms, counter: counter++ % 1000, deviceId: device }),
    payload,
  });
  const end = start + minutes * 60_000;
  const res = await mergeBatch(db, mech, {
    deviceId: device,
    cursor: null,
    operations: [
      op("clock.on", start, { clockId, startedAt: new Date(start).toISOString() }),
      op("clock.off", end, { clockId, endedAt: new Date(end).toISOString() }),
    ] as never,
  });
  expect(res.refused).toEqual([]);
  expect(res.accepted).toHaveLength(2);
}

describe("the final bill equals the approved lines by the stated rules (property, real PostgreSQL)", () => {
  it("holds for random quotes, extra work, answers, clocked time, fitted parts, deposits, tax rates and choices", async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(lineArb, { minLength: 1, maxLength: 4 }),
        fc.array(
          fc.array(fc.record({ line: lineArb, answer: fc.constantFrom("approved", "declined", "none") }), { minLength: 1, maxLength: 3 }),
          {
            maxLength: 2,
          },
        ),
        fc.integer({ min: 0, max: 10_000 }), // tax rate, basis points
        fc.integer({ min: 0, max: 2_000 }), // clocked minutes (0: no clock)
        fc.array(
          fc.record({
            partNumber: fc.constantFrom("GS-A1", "GS-X9", "GS-Y8"),
            quantity: fc.integer({ min: 1, max: 20 }),
            price: fc.integer({ min: 0, max: 500_000 }),
            add: fc.boolean(),
          }),
          {
            maxLength: 3,
          },
        ),
        fc.integer({ min: 0, max: 500_000 }), // deposit paid
        fc.array(fc.boolean(), { minLength: 12, maxLength: 12 }), // clocked (true) or quoted, per labour line in order
        async (quoteLines, sups, taxRateBp, minutes, fitted, deposit, basisFlags) => {
          const jobId = await newJobInBuild(quoteLines, taxRateBp, deposit);
          const supLines: Array<Line & { answer: string }> = [];
          for (const sup of sups) {
            const { supplementId } = await writeSupplement(db, fx.shopId, office.id, jobId, {
              finding: "Found wear while in build",
              lines: sup.map((s, i) => ({
                kind: s.line.kind,
                description: `Extra ${i + 1}`,
                partNumber: s.line.partNumber,
                quantityHundredths: s.line.qty,
                unitPriceMinor: s.line.price,
              })),
            });
            const lines = await db
              .selectFrom("supplement_lines")
              .select(["id", "position"])
              .where("supplement_id", "=", supplementId)
              .orderBy("position")
              .execute();
            const answered = sup.some((s) => s.answer === "none") ? [] : sup;
            if (answered.length)
              await answerAsCustomer(db, customer, supplementId, {
                decisions: answered.map((s, i) => ({ lineId: lines[i].id, decision: s.answer as "approved" | "declined", comment: "" })),
              });
            sup.forEach((s) => supLines.push({ ...s.line, answer: answered.length ? s.answer : "none" }));
          }
          if (minutes > 0) await clock(jobId, minutes);
          const partIds: string[] = [];
          for (const p of fitted) {
            const row = await db
              .insertInto("parts_fitted")
              .values({
                shop_id: fx.shopId,
                work_order_id: jobId,
                step_id: null,
                part_number: p.partNumber,
                description: "Fitted part",
                serial: null,
                batch: null,
                quantity: p.quantity,
                fitted_by: office.id,
              })
              .returning("id")
              .executeTakeFirstOrThrow();
            partIds.push(row.id);
          }
          // which labour lines are billed: the quote's, and approved extra work
          const billed = [
            ...(await db
              .selectFrom("quote_lines as l")
              .innerJoin("quotes as q", "q.id", "l.quote_id")
              .select(["l.id", "l.kind", "l.quantity_hundredths as qty", "l.unit_price_minor as price", "l.part_number as pn"])
              .where("q.work_order_id", "=", jobId)
              .orderBy("l.position")
              .execute()),
            ...(await db
              .selectFrom("supplement_lines as l")
              .innerJoin("supplements as s", "s.id", "l.supplement_id")
              .innerJoin("supplement_decisions as d", "d.supplement_line_id", "l.id")
              .select(["l.id", "l.kind", "l.quantity_hundredths as qty", "l.unit_price_minor as price", "l.part_number as pn"])
              .where("s.work_order_id", "=", jobId)
              .where("d.decision", "=", "approved")
              .orderBy("s.number")
              .orderBy("l.position")
              .execute()),
          ];
          const labour = billed.filter((l) => l.kind === "labour");
          const choice = labour.map((l, i) => ({ lineId: l.id, basis: basisFlags[i % 12] ? ("clocked" as const) : ("quoted" as const) }));
          // a fitted part is offered only when no quote or extra-work line names its part number
          const named = new Set([...quoteLines, ...supLines].map((l) => l.partNumber).filter(Boolean));
          const adds = fitted.map((p, i) => ({ ...p, id: partIds[i] })).filter((p) => p.add && !named.has(p.partNumber));
          await issueBill(db, fx.shopId, office.id, jobId, {
            labour: choice,
            addParts: adds.map((p) => ({ partFittedId: p.id, unitPriceMinor: p.price })),
          });

          const bill = (await issuedBillOf(db, fx.shopId, jobId))!;
          // every quote and extra-work line is on the bill; declined and unanswered ones not counted
          expect(bill.lines.filter((l) => l.source !== "fitted_part")).toHaveLength(quoteLines.length + supLines.length);
          for (const l of bill.lines.filter((x) => x.source === "supplement" && x.answer !== "approved")) {
            expect(l.counted).toBe(false);
            expect(Number(l.lineTotalMinor)).toBe(0);
          }
          expect(bill.lines.filter((l) => l.answer === "declined")).toHaveLength(supLines.filter((l) => l.answer === "declined").length);
          // the clocked hours: whole minutes → hundredths of an hour, half up
          const clockedTotal = Math.floor((minutes * 100 + 30) / 60);
          expect(bill.clockedHundredths).toBe(clockedTotal);
          const counted = bill.lines.filter((l) => l.counted && l.kind === "labour");
          const weightSum = counted.reduce((s, l) => s + l.quotedHundredths, 0);
          if (counted.length) {
            expect(counted.reduce((s, l) => s + (l.clockedHundredths ?? 0), 0)).toBe(clockedTotal);
            for (const l of counted) {
              const exact = (BigInt(l.quotedHundredths) * BigInt(clockedTotal) * 1000n) / BigInt(weightSum);
              expect(Math.abs(Number(BigInt(l.clockedHundredths!) * 1000n - exact))).toBeLessThan(1000);
            }
          }
          // each billed line, recomputed
          let subtotal = 0n;
          for (const l of bill.lines.filter((x) => x.counted)) {
            const qty =
              l.kind === "labour" ? (l.labourBasis === "clocked" ? l.clockedHundredths! : l.quotedHundredths) : l.quantityHundredths;
            expect(l.quantityHundredths).toBe(qty);
            const expected = halfUp(BigInt(qty) * BigInt(l.unitPriceMinor), 100n);
            expect(BigInt(l.lineTotalMinor)).toBe(expected);
            subtotal += expected;
          }
          // every billed quote and extra-work line, at its own price and quoted quantity
          for (const b of billed) {
            const onBill = bill.lines.find((l) => l.lineId === b.id)!;
            expect(onBill.counted).toBe(true);
            expect(Number(onBill.unitPriceMinor)).toBe(Number(b.price));
            expect(onBill.quotedHundredths).toBe(b.qty);
            expect(onBill.labourBasis).toBe(b.kind === "labour" ? choice.find((c) => c.lineId === b.id)!.basis : null);
          }
          // added parts: quantity as fitted, at the price entered
          const added = bill.lines.filter((l) => l.source === "fitted_part");
          expect(added).toHaveLength(adds.length);
          for (const p of adds) expect(added.some((l) => Number(l.lineTotalMinor) === p.quantity * p.price)).toBe(true);
          const tax = halfUp(subtotal * BigInt(taxRateBp), 10_000n);
          expect(BigInt(bill.subtotalMinor)).toBe(subtotal);
          expect(BigInt(bill.taxMinor)).toBe(tax);
          expect(BigInt(bill.totalMinor)).toBe(subtotal + tax);
          expect(bill.taxRateBp).toBe(taxRateBp);
          expect(BigInt(bill.depositsPaidMinor)).toBe(BigInt(deposit));
          expect(BigInt(bill.balanceDueMinor)).toBe(subtotal + tax - BigInt(deposit));
        },
      ),
      { numRuns: 60 },
    );
  }, 240_000);
});

describe("a bill too large, and a second issue", () => {
  it("refuses a bill past 100,000,000.00 with the reason, storing nothing; an issued bill is not issued again", async () => {
    const big = await newJobInBuild([{ kind: "part", qty: 100_000, price: 2_000_000_000, partNumber: null }], 2000, 0);
    await expect(issueBill(db, fx.shopId, office.id, big, {})).rejects.toThrow(
      "The bill would be larger than Benchtag accepts (100,000,000.00).",
    );
    expect(await issuedBillOf(db, fx.shopId, big)).toBeNull();

    const job = await newJobInBuild([{ kind: "labour", qty: 350, price: 6800, partNumber: null }], 2000, 1000);
    const first = await issueBill(db, fx.shopId, office.id, job, {});
    // 3.50 h × 68.00 = 238.00; tax 20 % = 47.60; total 285.60; less the deposit 10.00
    expect([Number(first.subtotal_minor), Number(first.tax_minor), Number(first.total_minor), Number(first.balance_due_minor)]).toEqual([
      23800, 4760, 28560, 27560,
    ]);
    await expect(issueBill(db, fx.shopId, office.id, job, {})).rejects.toThrow(
      `The bill for this job is already issued (bill ${first.number})`,
    );
    await expect(sql`UPDATE invoice_lines SET line_total_minor = 0 WHERE invoice_id = ${first.id}`.execute(db)).rejects.toThrow();
  });
});
