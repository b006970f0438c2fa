import { sql } from "kysely";
import { beforeAll, describe, expect, it } from "vitest";
import { issueBill, issuedBillOf } from "@/db/office/final-bill";
import { approveQuoteAsCustomer, declineQuoteAsCustomer, quoteWithLines, saveQuoteDraft, sendQuote } from "@/db/office/quotes";
import { answerAsCustomer, answerByLink, linkState, makeSupplementLink, supplementsOf, writeSupplement } from "@/db/office/supplements";
import { createBike } from "@/db/shop/bikes";
import { bookIn, moveWorkOrder } from "@/db/shop/work-orders";
import { supplementSchema } from "@/lib/office/extra-work-schemas";
import type { SessionUser } from "@/lib/auth/session-user";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { insertQuotedJob } from "./support/quoted-job";
import { useTestDb } from "./support/test-db";

// Extra work on real PostgreSQL: the office writes it, the customer answers each line once (signed
// in, or through the one-time e-mailed link); an expired, used, unknown or another customer's link
// says so and changes nothing; declined lines stay on record and on the bill, not billed.

const db = useTestDb();
let fx: ShopFixture;
let other: ShopFixture;
let customer: SessionUser;
let number = 8000;

beforeAll(async () => {
  fx = await createShopFixture(db);
  other = await createShopFixture(db);
  customer = { ...fx.users.customer, customerId: fx.customerId };
});

async function jobWithApprovedQuote() {
  const n = ++number;
  return (await insertQuotedJob(db, fx, { number: n, title: `Extra ${n}`, status: "in_build" })).workOrderId;
}

const TWO_LINES = {
  finding: "Cam chain guide cracked at the top mount",
  lines: [
    { kind: "part" as const, description: "Cam chain guide", partNumber: "GS-CCG", quantityHundredths: 100, unitPriceMinor: 4250 },
    { kind: "labour" as const, description: "Fit the guide", quantityHundredths: 150, unitPriceMinor: 6800 },
  ],
};

/** Written by the office, and its link made as the queue worker makes it when it sends the e-mail. */
async function written(jobId: string) {
  const w = await writeSupplement(db, fx.shopId, fx.users.office.id, jobId, TWO_LINES);
  // nothing that answers is stored before the e-mail goes out
  expect(await db.selectFrom("supplement_links").select("id").where("supplement_id", "=", w.supplementId).execute()).toEqual([]);
  const lines = await db
    .selectFrom("supplement_lines")
    .select("id")
    .where("supplement_id", "=", w.supplementId)
    .orderBy("position")
    .execute();
  return { ...w, token: await makeSupplementLink(db, w.supplementId), lineIds: lines.map((l) => l.id) };
}
const answers = (ids: string[]) => ({
  decisions: [
    { lineId: ids[0], decision: "declined" as const, comment: "I have one at home" },
    { lineId: ids[1], decision: "approved" as const, comment: "" },
  ],
});
const decisionCount = async (jobId: string) =>
  Number(
    (
      await db
        .selectFrom("supplement_decisions")
        .select((eb) => eb.fn.countAll().as("n"))
        .where("work_order_id", "=", jobId)
        .executeTakeFirstOrThrow()
    ).n,
  );

describe("answering extra work through the e-mailed link", () => {
  it("records both answers once, with the comment; the job total counts only the approved line", async () => {
    const job = await jobWithApprovedQuote();
    const w = await written(job);
    expect(w.token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    // only the hash is stored
    const stored = await db
      .selectFrom("supplement_links")
      .select("token_sha256")
      .where("supplement_id", "=", w.supplementId)
      .executeTakeFirstOrThrow();
    expect(stored.token_sha256).not.toContain(w.token);
    await answerByLink(db, w.token, answers(w.lineIds), null);
    const [view] = await supplementsOf(db, [job]);
    expect(view.lines.map((l) => [l.answer?.decision, l.answer?.comment, l.answer?.by])).toEqual([
      ["declined", "I have one at home", "the customer, by the e-mailed link"],
      ["approved", "", "the customer, by the e-mailed link"],
    ]);
    const bill = await issueBill(db, fx.shopId, fx.users.office.id, job, {});
    // only the labour: 1.50 h × 68.00 = 102.00, tax 20 % = 20.40
    expect(Number(bill.total_minor)).toBe(12240);
    const issued = (await issuedBillOf(db, fx.shopId, job))!;
    expect(issued.lines.map((l) => [l.description, l.answer, l.counted])).toEqual([
      ["Cam chain guide", "declined", false],
      ["Fit the guide", "approved", true],
    ]);
  });

  it("a used link says so and changes nothing", async () => {
    const job = await jobWithApprovedQuote();
    const w = await written(job);
    await answerByLink(db, w.token, answers(w.lineIds), null);
    await expect(answerByLink(db, w.token, answers(w.lineIds), null)).rejects.toThrow(
      /This link was already used on .*; nothing was changed/,
    );
    expect(await decisionCount(job)).toBe(2);
  });

  it("an expired link says so and changes nothing", async () => {
    const job = await jobWithApprovedQuote();
    const w = await written(job);
    const later = new Date(Date.now() + 15 * 86_400_000);
    await expect(answerByLink(db, w.token, answers(w.lineIds), null, later)).rejects.toThrow(
      /This link expired on .*; nothing was changed/,
    );
    expect(await decisionCount(job)).toBe(0);
    expect((await linkState(db, w.token)).kind).toBe("open");
  });

  it("another customer's link says so and changes nothing, and so does a link we never sent", async () => {
    const job = await jobWithApprovedQuote();
    const w = await written(job);
    await expect(answerByLink(db, w.token, answers(w.lineIds), other.customerId)).rejects.toThrow(
      "This link was sent to another customer; nothing was changed.",
    );
    await expect(answerByLink(db, "A".repeat(43), answers(w.lineIds), null)).rejects.toThrow("This link is not one we sent");
    expect(await decisionCount(job)).toBe(0);
    // the link's own customer, signed in, may use it
    await answerByLink(db, w.token, answers(w.lineIds), fx.customerId);
    expect(await decisionCount(job)).toBe(2);
  });
});

describe("answering on the customer's own page", () => {
  it("each line is answered once; a partial answer, another customer and an answer after the bill are refused", async () => {
    const job = await jobWithApprovedQuote();
    const w = await written(job);
    await expect(
      answerAsCustomer(db, customer, w.supplementId, { decisions: [{ lineId: w.lineIds[0], decision: "approved" }] }),
    ).rejects.toThrow("Answer every line: line 2 still need an answer.");
    const stranger = { ...other.users.customer, customerId: other.customerId };
    await expect(answerAsCustomer(db, stranger, w.supplementId, answers(w.lineIds))).rejects.toThrow("This extra work is not on your bike");
    expect(await decisionCount(job)).toBe(0);
    await answerAsCustomer(db, customer, w.supplementId, answers(w.lineIds));
    await expect(answerAsCustomer(db, customer, w.supplementId, answers(w.lineIds))).rejects.toThrow("Line 1 was already answered");
    // an answer is never edited
    await expect(sql`UPDATE supplement_decisions SET decision = 'approved' WHERE work_order_id = ${job}`.execute(db)).rejects.toThrow();
    const w2 = await written(job);
    await issueBill(db, fx.shopId, fx.users.office.id, job, {});
    await expect(answerAsCustomer(db, customer, w2.supplementId, answers(w2.lineIds))).rejects.toThrow(
      "The bill for this job is already issued",
    );
    await expect(writeSupplement(db, fx.shopId, fx.users.office.id, job, TWO_LINES)).rejects.toThrow(
      "The bill for this job is already issued",
    );
  });

  it("extra work is written only while in build (or review, or on the dyno), with an approved quote", async () => {
    const n = ++number;
    const wo = await db
      .insertInto("work_orders")
      .values({
        shop_id: fx.shopId,
        bike_id: fx.bike.id,
        number: n,
        title: "Early",
        status: "inspected",
        intake_odometer_km: 1,
        assigned_mechanic_id: null,
        closed_at: null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await expect(writeSupplement(db, fx.shopId, fx.users.office.id, wo.id, TWO_LINES)).rejects.toThrow(
      "Extra work can be written while the bike is in build, in review or on the dyno.",
    );
  });
});

describe("bad input to extra work", () => {
  const issues = (input: unknown) => {
    const r = supplementSchema.safeParse(input);
    return r.success ? [] : r.error.issues.map((i) => i.message);
  };
  const line = (over: Record<string, unknown>) => ({ ...TWO_LINES, lines: [{ ...TWO_LINES.lines[0], ...over }] });
  it("names the field and the rule", () => {
    expect(issues(line({ quantityHundredths: 0 }))).toEqual(["Quantity: at least 0.01."]);
    expect(issues(line({ quantityHundredths: 100_001 }))).toEqual(["Quantity: at most 1000."]);
    expect(issues(line({ quantityHundredths: 1.5 }))).toEqual(["Quantity: at most two decimals."]);
    expect(issues(line({ unitPriceMinor: Number.NaN }))[0]).toMatch(/^Unit price: enter a number\.$/);
    expect(issues(line({ unitPriceMinor: Infinity }))[0]).toMatch(/^Unit price: /);
    expect(issues(line({ unitPriceMinor: -1 }))).toEqual(["Unit price: at least 0.00."]);
    expect(issues(line({ unitPriceMinor: 100_000_001 }))).toEqual(["Unit price: at most 1,000,000.00."]);
    expect(issues(line({ description: "Guide\u0000" }))).toEqual(["Description holds a NUL character, which cannot be stored: retype it."]);
    expect(issues({ ...TWO_LINES, finding: "Worn guide \uD800" })).toEqual([
      "Finding holds a broken character (half of an emoji or symbol): retype it.",
    ]);
    expect(issues({ ...TWO_LINES, lines: [] })).toEqual(["Lines: add at least one line."]);
  });
});

describe("the customer declines a quote", () => {
  it("records the decline with the comment once; the quote can no longer be approved", async () => {
    const bike = await createBike(db, fx.shopId, { customerId: fx.customerId, make: "Corvid", model: "RX1000" });
    const wo = await bookIn(db, fx.shopId, fx.users.office.id, { bikeId: bike.id, title: "Top end", complaint: "Rattle", odometerKm: 5 });
    await moveWorkOrder(db, fx.shopId, fx.users.office.id, wo.id, "inspected");
    await saveQuoteDraft(db, fx.shopId, fx.users.office.id, wo.id, {
      lines: [{ kind: "labour", description: "Top end", quantityHundredths: 500, unitPriceMinor: 7000 }],
      depositMinor: 0,
    });
    const { quoteId } = await sendQuote(db, fx.shopId, fx.users.office.id, wo.id);
    const stranger = { ...other.users.customer, customerId: other.customerId };
    await expect(declineQuoteAsCustomer(db, stranger, quoteId, "")).rejects.toThrow("This quote is not yours to decline.");
    await declineQuoteAsCustomer(db, customer, quoteId, "Too dear for now");
    await expect(declineQuoteAsCustomer(db, customer, quoteId, "")).rejects.toThrow("You have already declined this quote.");
    await expect(approveQuoteAsCustomer(db, customer, quoteId)).rejects.toThrow("You declined this quote");
    const q = (await quoteWithLines(db, fx.shopId, quoteId))!;
    expect(q.declined?.comment).toBe("Too dear for now");
    expect(q.status).toBe("sent");
  });
});
