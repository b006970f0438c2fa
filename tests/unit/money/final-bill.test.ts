import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { amountFor, buildBill, shareInProportion, type BillSourceLine } from "@/lib/money/final-bill";

// The bill's pure arithmetic; the same rules against real PostgreSQL are in
// tests/integration/final-bill.test.ts.

describe("sharing the clocked hours among labour lines", () => {
  it("adds up to the total exactly, each share within one unit of its exact proportion", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 100_000 }), { minLength: 1, maxLength: 20 }),
        fc.integer({ min: 0, max: 1_000_000 }),
        (w, total) => {
          const shares = shareInProportion(w, total);
          expect(shares.reduce((a, b) => a + b, 0)).toBe(total);
          const sum = w.reduce((a, b) => a + b, 0);
          if (sum > 0) shares.forEach((s, i) => expect(Math.abs(s * sum - w[i] * total)).toBeLessThan(sum));
        },
      ),
    );
  });

  it("worked example: 2.00 h and 1.00 h quoted, 4.00 h clocked → 2.67 h and 1.33 h", () => {
    expect(shareInProportion([200, 100], 400)).toEqual([267, 133]);
  });
});

describe("a bill by the stated rules", () => {
  const line = (over: Partial<BillSourceLine>): BillSourceLine => ({
    ref: "q1",
    source: "quote",
    kind: "labour",
    description: "Rebuild",
    partNumber: null,
    quantityHundredths: 350,
    unitPriceMinor: 6800,
    answer: "approved",
    supplementNumber: null,
    ...over,
  });
  it("bills approved lines, lists declined ones at 0, takes labour as clocked when chosen, adds a fitted part, charges tax once half up", () => {
    const bill = buildBill(
      {
        lines: [
          line({}),
          line({
            ref: "s1",
            source: "supplement",
            kind: "part",
            description: "Guide",
            quantityHundredths: 100,
            unitPriceMinor: 4250,
            answer: "declined",
            supplementNumber: 1,
          }),
          line({ ref: "s2", source: "supplement", quantityHundredths: 150, answer: "approved", supplementNumber: 1 }),
        ],
        fittedUnquoted: [{ ref: "p1", partNumber: "GS-OF-204", description: "Oil filter", quantity: 2 }],
        clockedHundredths: 600,
        depositsPaidMinor: 10_000,
        taxRateBp: 1750,
      },
      { labour: { q1: "clocked" }, addParts: [{ ref: "p1", unitPriceMinor: 999 }] },
    );
    // clocked 6.00 h shared 350 : 150 → 4.20 h and 1.80 h; q1 billed as clocked: 4.20 × 68.00 = 285.60
    expect(bill.lines.map((l) => [l.ref, l.counted, l.labourBasis, l.clockedHundredths, l.lineTotalMinor])).toEqual([
      ["q1", true, "clocked", 420, 28560],
      ["s1", false, null, null, 0],
      ["s2", true, "quoted", 180, 10200],
      ["p1", true, null, null, 1998],
    ]);
    // subtotal 407.58; tax 17.5 % = 71.3265 → 71.33 (half up); total 478.91; less 100.00 deposit
    expect([bill.subtotalMinor, bill.taxMinor, bill.totalMinor, bill.balanceDueMinor]).toEqual([40758, 7133, 47891, 37891]);
  });

  it("rounds a line half up to the minor unit (common practice for an invoice line; from memory)", () => {
    expect(amountFor(150, 333)).toBe(500); // 4.995 → 5.00
    expect(amountFor(1, 49)).toBe(0); // 0.0049 → 0.00
    expect(amountFor(1, 50)).toBe(1); // 0.005 → 0.01
  });
});
