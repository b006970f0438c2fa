import "server-only";
import type { Kysely, Transaction } from "kysely";
import { minutesToHundredths } from "@/lib/clock/hours";
import { Refusal } from "@/lib/errors";
import { mayIssueBill } from "@/lib/office/extra-work";
import { billChoicesSchema, type BillChoicesInput } from "@/lib/office/extra-work-schemas";
import { BillTooLarge, buildBill, type BillChoices, type BillInput, type BillSourceLine, type FittedPart } from "@/lib/money/final-bill";
import { appendAudit } from "../audit/append";
import { lockWorkOrder } from "../shop/work-orders";
import { hoursOfJob } from "../bench/clocks";
import { heldOfDeposits } from "./deposits";
import { supplementsOf } from "./supplements";
import type { Database } from "../schema";
import { holdKeys } from "../setup/key-locks";

// The final bill: gathered from the approved quote, the answered extra work, the clocked hours and
// the parts fitted (lib/money/final-bill.ts holds the arithmetic), issued once, never edited.

type Db = Kysely<Database> | Transaction<Database>;

const norm = (p: string | null) => (p ?? "").trim().toUpperCase();

/** Everything the bill is made from, as the office's panel and the issue both read it. */
export async function billInputOf(db: Db, shopId: string, workOrderId: string) {
  const quote = await db
    .selectFrom("quotes")
    .select(["id", "currency"])
    .where("work_order_id", "=", workOrderId)
    .where("shop_id", "=", shopId)
    .where("status", "=", "approved")
    .orderBy("version", "desc")
    .executeTakeFirst();
  if (!quote) return null;
  const [shop, quoteLines, supLines, parts, paid, hours] = await Promise.all([
    db.selectFrom("shops").select(["tax_rate_bp", "currency"]).where("id", "=", shopId).executeTakeFirstOrThrow(),
    db.selectFrom("quote_lines").selectAll().where("quote_id", "=", quote.id).orderBy("position").execute(),
    db
      .selectFrom("supplement_lines as l")
      .innerJoin("supplements as s", "s.id", "l.supplement_id")
      .leftJoin("supplement_decisions as d", "d.supplement_line_id", "l.id")
      .select(["l.id", "l.kind", "l.description", "l.part_number", "l.quantity_hundredths", "l.unit_price_minor", "s.number", "d.decision"])
      .where("s.work_order_id", "=", workOrderId)
      .orderBy("s.number")
      .orderBy("l.position")
      .execute(),
    db
      .selectFrom("parts_fitted as p")
      .leftJoin("withdrawals as wd", "wd.operation_id", "p.operation_id")
      .select(["p.id", "p.part_number", "p.description", "p.quantity"])
      .where("p.work_order_id", "=", workOrderId)
      .where("p.shop_id", "=", shopId)
      .where("wd.operation_id", "is", null)
      .orderBy("p.fitted_at")
      .orderBy("p.id")
      .execute(),
    db
      .selectFrom("deposits")
      // what is still held of each paid deposit (a part refunded at the provider is not taken off twice)
      .select(heldOfDeposits().as("s"))
      .where("work_order_id", "=", workOrderId)
      .where("status", "=", "paid")
      .executeTakeFirstOrThrow(),
    hoursOfJob(db as Kysely<Database>, shopId, workOrderId),
  ]);
  const lines: BillSourceLine[] = [
    ...quoteLines.map((l) => ({
      ref: l.id,
      source: "quote" as const,
      kind: l.kind,
      description: l.description,
      partNumber: l.part_number,
      quantityHundredths: l.quantity_hundredths,
      unitPriceMinor: Number(l.unit_price_minor),
      answer: "approved" as const,
      supplementNumber: null,
    })),
    ...supLines.map((l) => ({
      ref: l.id,
      source: "supplement" as const,
      kind: l.kind,
      description: l.description,
      partNumber: l.part_number,
      quantityHundredths: l.quantity_hundredths,
      unitPriceMinor: Number(l.unit_price_minor),
      answer: l.decision ?? ("no_answer" as const),
      supplementNumber: l.number,
    })),
  ];
  const named = new Set(lines.map((l) => norm(l.partNumber)).filter(Boolean));
  const fittedUnquoted: FittedPart[] = parts
    .filter((p) => !named.has(norm(p.part_number)))
    .map((p) => ({ ref: p.id, partNumber: p.part_number, description: p.description ?? "", quantity: p.quantity }));
  const input: BillInput = {
    lines,
    fittedUnquoted,
    clockedHundredths: minutesToHundredths(hours?.totalMinutes ?? 0),
    depositsPaidMinor: Number(paid.s),
    taxRateBp: shop.tax_rate_bp,
  };
  return { quoteId: quote.id, currency: quote.currency, input, clockRunning: hours?.running ?? false };
}

export type BillSource = NonNullable<Awaited<ReturnType<typeof billInputOf>>>;

/** The office's choices checked against the job: labour lines billed, parts offered; plain words otherwise. */
function checkedChoices(src: BillSource, raw: BillChoicesInput): BillChoices {
  const c = billChoicesSchema.parse(raw);
  const labour = new Set(src.input.lines.filter((l) => l.kind === "labour" && l.answer === "approved").map((l) => l.ref));
  const offered = new Set(src.input.fittedUnquoted.map((p) => p.ref));
  for (const l of c.labour)
    if (!labour.has(l.lineId))
      throw new Refusal("Labour: a line chosen is not approved labour of this job.", 422, [
        { path: "labour", message: "not approved labour of this job" },
      ]);
  for (const p of c.addParts)
    if (!offered.has(p.partFittedId))
      throw new Refusal("Parts: a part chosen is not a part fitted to this job without a quote line.", 422, [
        { path: "addParts", message: "not offered for this job" },
      ]);
  if (c.labour.some((l) => l.basis === "clocked") && src.clockRunning)
    throw new Refusal("A clock is still running on this job: clock off (or close it from review) before billing labour as clocked.", 409);
  return {
    labour: Object.fromEntries(c.labour.map((l) => [l.lineId, l.basis])),
    addParts: c.addParts.map((p) => ({ ref: p.partFittedId, unitPriceMinor: p.unitPriceMinor })),
  };
}

/** Issues the job's bill once, with the office's choices; a second issue is refused (the first stands). */
export async function issueBill(db: Kysely<Database>, shopId: string, userId: string, workOrderId: string, choices: BillChoicesInput) {
  return db.transaction().execute((trx) => issueBillIn(trx, shopId, userId, workOrderId, choices, { refuseIfIssued: true }));
}

export async function issueBillIn(
  trx: Transaction<Database>,
  shopId: string,
  userId: string,
  workOrderId: string,
  choices: BillChoicesInput,
  opts: { refuseIfIssued: boolean },
) {
  const wo = await lockWorkOrder(trx, shopId, workOrderId);
  const existing = await trx.selectFrom("invoices").selectAll().where("work_order_id", "=", workOrderId).executeTakeFirst();
  if (existing) {
    if (opts.refuseIfIssued)
      throw new Refusal(`The bill for this job is already issued (bill ${existing.number}); an issued bill is not changed.`, 409);
    return existing;
  }
  if (!mayIssueBill(wo.status)) throw new Refusal("The bill is issued once the approved work is under way (in build or later).", 409);
  const src = await billInputOf(trx, shopId, workOrderId);
  if (!src) throw new Refusal("There is no approved quote to invoice.", 409);
  const chosen = checkedChoices(src, choices);
  let bill;
  try {
    bill = buildBill(src.input, chosen);
  } catch (e) {
    if (e instanceof BillTooLarge) throw new Refusal(e.message, 422);
    throw e;
  }
  // bill numbers are the shop's, and bills of two jobs may be issued at once: one number at a time
  await holdKeys(trx, [`bill-numbers:${shopId}`]);
  const last = await trx
    .selectFrom("invoices")
    .select((eb) => eb.fn.max("number").as("n"))
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
  const invoice = await trx
    .insertInto("invoices")
    .values({
      shop_id: shopId,
      work_order_id: workOrderId,
      quote_id: src.quoteId,
      number: (last?.n ?? 5000) + 1,
      currency: src.currency,
      subtotal_minor: bill.subtotalMinor,
      tax_minor: bill.taxMinor,
      total_minor: bill.totalMinor,
      deposits_paid_minor: bill.depositsPaidMinor,
      balance_due_minor: bill.balanceDueMinor,
      tax_rate_bp: bill.taxRateBp,
      clocked_hundredths: bill.clockedHundredths,
      created_by: userId,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
  if (bill.lines.length)
    await trx
      .insertInto("invoice_lines")
      .values(
        bill.lines.map((l, i) => ({
          invoice_id: invoice.id,
          position: i,
          source: l.source,
          quote_line_id: l.source === "quote" ? l.ref : null,
          supplement_line_id: l.source === "supplement" ? l.ref : null,
          part_fitted_id: l.source === "fitted_part" ? l.ref : null,
          kind: l.kind,
          description: l.description,
          part_number: l.partNumber,
          answer: l.answer,
          labour_basis: l.labourBasis,
          quoted_hundredths: l.quotedHundredths,
          clocked_hundredths: l.clockedHundredths,
          quantity_hundredths: l.quantityHundredths,
          unit_price_minor: l.unitPriceMinor,
          line_total_minor: l.lineTotalMinor,
          counted: l.counted,
        })),
      )
      .execute();
  await appendAudit(trx, [
    {
      shopId,
      actorId: userId,
      action: "bill.issue",
      entity: "invoice",
      entityId: invoice.id,
      workOrderId,
      outcome: "accepted",
      detail: { number: invoice.number, totalMinor: bill.totalMinor, balanceDueMinor: bill.balanceDueMinor },
    },
  ]);
  return invoice;
}

/** The issued bill of a work order with its lines and balance payments (null: not issued yet). */
export async function issuedBillOf(db: Db, shopId: string, workOrderId: string) {
  const inv = await db
    .selectFrom("invoices")
    .select([
      "id",
      "number",
      "currency",
      "subtotal_minor as subtotalMinor",
      "tax_minor as taxMinor",
      "tax_rate_bp as taxRateBp",
      "total_minor as totalMinor",
      "deposits_paid_minor as depositsPaidMinor",
      "balance_due_minor as balanceDueMinor",
      "clocked_hundredths as clockedHundredths",
      "created_at as createdAt",
    ])
    .where("work_order_id", "=", workOrderId)
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
  if (!inv) return null;
  const [lines, payments] = await Promise.all([
    db
      .selectFrom("invoice_lines as il")
      .leftJoin("supplement_lines as sl", "sl.id", "il.supplement_line_id")
      .leftJoin("supplements as s", "s.id", "sl.supplement_id")
      .select([
        "il.id",
        "il.source",
        "il.kind",
        "il.description",
        "il.part_number as partNumber",
        "il.answer",
        "il.labour_basis as labourBasis",
        "il.quoted_hundredths as quotedHundredths",
        "il.clocked_hundredths as clockedHundredths",
        "il.quantity_hundredths as quantityHundredths",
        "il.unit_price_minor as unitPriceMinor",
        "il.line_total_minor as lineTotalMinor",
        "il.counted",
        "s.number as supplementNumber",
        "il.quote_line_id as quoteLineId",
        "il.supplement_line_id as supplementLineId",
        "il.part_fitted_id as partFittedId",
      ])
      .where("il.invoice_id", "=", inv.id)
      .orderBy("il.position")
      .execute(),
    db
      .selectFrom("balance_payments")
      .select(["id", "status", "amount_minor as amountMinor", "paid_at as paidAt"])
      .where("invoice_id", "=", inv.id)
      .orderBy("created_at")
      .execute(),
  ]);
  return {
    ...inv,
    lines: lines.map(({ quoteLineId, supplementLineId, partFittedId, ...l }) => ({
      ...l,
      /** The quote line, extra-work line or fitted part it was made from. */
      lineId: (quoteLineId ?? supplementLineId ?? partFittedId)!,
    })),
    payments,
  };
}

export type IssuedBill = NonNullable<Awaited<ReturnType<typeof issuedBillOf>>>;

/** What the office's extra-work and bill panels need: the job's state, its extra work, its photos, the bill's sources or the issued bill. */
export async function billPageData(db: Kysely<Database>, shopId: string, workOrderId: string) {
  const wo = await db
    .selectFrom("work_orders")
    .select("status")
    .where("id", "=", workOrderId)
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
  if (!wo) return null;
  const [supplements, photos, source, issued] = await Promise.all([
    supplementsOf(db, [workOrderId]),
    db
      .selectFrom("attachments")
      .select(["id", "caption"])
      .where("work_order_id", "=", workOrderId)
      .where("shop_id", "=", shopId)
      .orderBy("created_at")
      .execute(),
    billInputOf(db, shopId, workOrderId),
    issuedBillOf(db, shopId, workOrderId),
  ]);
  return { status: wo.status, supplements, photos, source, issued };
}
