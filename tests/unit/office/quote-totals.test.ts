import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { credentialsSchema } from "@/lib/auth/credentials";
import { quoteDraftSchema } from "@/lib/office/schemas";
import {
  divideHalfUp,
  formatMinor,
  lineTotalMinor,
  MAX_MINOR,
  parseHundredths,
  quoteSubtotalTooLarge,
  quoteTotals,
} from "@/lib/money/quote-totals";

// Expected figures below are worked by hand (pencil arithmetic), not produced by the code under test.
describe("quote totals (integer minor units, tax once on the subtotal, half-up)", () => {
  it("rounds a line half-up: 2.5 h × £33.33 = £83.325 → £83.33", () => {
    expect(lineTotalMinor({ quantityHundredths: 250, unitPriceMinor: 3333 })).toBe(8333);
  });

  it("rounds a line below the half down: 0.33 × £0.10 = 3.3p → 3p", () => {
    expect(lineTotalMinor({ quantityHundredths: 33, unitPriceMinor: 10 })).toBe(3);
  });

  it("charges tax once on the subtotal, not per line", () => {
    // three lines of 1 × £0.02 at 20%: per-line tax would be 3 × 0.4p → 0p each = 0p;
    // on the subtotal: 6p × 20% = 1.2p → 1p.
    const t = quoteTotals(
      [
        { quantityHundredths: 100, unitPriceMinor: 2 },
        { quantityHundredths: 100, unitPriceMinor: 2 },
        { quantityHundredths: 100, unitPriceMinor: 2 },
      ],
      2000,
    );
    expect(t).toEqual({ lineTotals: [2, 2, 2], subtotalMinor: 6, taxMinor: 1, totalMinor: 7 });
  });

  it("rounds an exact half penny of tax up (half-up, not banker's)", () => {
    // subtotal 25p at 10% (1000 bp) = 2.5p → 3p (half-up; banker's rounding would give 2p)
    expect(quoteTotals([{ quantityHundredths: 100, unitPriceMinor: 25 }], 1000).taxMinor).toBe(3);
    // subtotal 35p at 10% = 3.5p → 4p (banker's would also give 4p)
    expect(quoteTotals([{ quantityHundredths: 100, unitPriceMinor: 35 }], 1000).taxMinor).toBe(4);
  });

  it("works a realistic quote: parts and labour at 20% VAT", () => {
    // 1 × £189.00 piston kit, 4 × £12.49 rings, 6.5 h × £68.00 labour
    // lines: 18900 + 4996 + 44200 = 68096; tax 20% = 13619.2 → 13619; total 81715
    const t = quoteTotals(
      [
        { quantityHundredths: 100, unitPriceMinor: 18900 },
        { quantityHundredths: 400, unitPriceMinor: 1249 },
        { quantityHundredths: 650, unitPriceMinor: 6800 },
      ],
      2000,
    );
    expect(t).toEqual({ lineTotals: [18900, 4996, 44200], subtotalMinor: 68096, taxMinor: 13619, totalMinor: 81715 });
  });

  it("refuses fractional or negative amounts instead of rounding them silently", () => {
    expect(() => lineTotalMinor({ quantityHundredths: 1.5, unitPriceMinor: 100 })).toThrow(/whole number/);
    expect(() => lineTotalMinor({ quantityHundredths: 100, unitPriceMinor: -1 })).toThrow(/whole number/);
    expect(() => quoteTotals([], 20.5)).toThrow(/tax rate/);
  });

  it("half-up division agrees with an exact BigInt reference for any amounts", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 10_000_000_000 }), fc.integer({ min: 0, max: 10_000 }), (subtotal, bp) => {
        const n = BigInt(subtotal) * BigInt(bp);
        const ref = (n * 2n + 10_000n) / 20_000n; // floor((2n + d) / 2d) = round half-up of n/d
        expect(divideHalfUp(subtotal * bp, 10_000)).toBe(Number(ref));
      }),
    );
  });

  it("reads quantities with at most two decimals and formats money", () => {
    expect(parseHundredths("2.5")).toBe(250);
    expect(parseHundredths("3")).toBe(300);
    expect(parseHundredths("0.125")).toBeNull();
    expect(parseHundredths("-1")).toBeNull();
    expect(formatMinor(123456, "GBP")).toBe("£1,234.56");
    expect(formatMinor(5, "EUR")).toBe("€0.05");
  });

  it("says when lines within range alone pass the most a quote holds together, exactly at the edge", () => {
    const line = (unitPriceMinor: number, quantityHundredths = 100) => ({ unitPriceMinor, quantityHundredths });
    // by hand: 2 × 50,000,000.00 = 100,000,000.00, the most; one minor unit more is too much
    expect(quoteSubtotalTooLarge([line(MAX_MINOR / 2), line(MAX_MINOR / 2)])).toBe(false);
    expect(quoteSubtotalTooLarge([line(MAX_MINOR / 2), line(MAX_MINOR / 2 + 1)])).toBe(true);
    // 0.01 × 100,000,000.00 = 1,000,000.00 a line: 100 lines make the most
    expect(quoteSubtotalTooLarge(Array.from({ length: 100 }, () => line(MAX_MINOR, 1)))).toBe(false);
    expect(quoteSubtotalTooLarge(Array.from({ length: 101 }, () => line(MAX_MINOR, 1)))).toBe(true);
    // a line out of range on its own is left to its own field's message
    expect(quoteSubtotalTooLarge([line(MAX_MINOR + 1), line(MAX_MINOR)])).toBe(false);
  });

  it("the quote form's schema names the lines when together they are too much, and quoteTotals is never reached with them", () => {
    const line = { kind: "part", description: "Crank", quantityHundredths: 100_000_00, unitPriceMinor: MAX_MINOR };
    const parsed = quoteDraftSchema.safeParse({ lines: Array.from({ length: 200 }, () => line), depositMinor: 0 });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => [i.path.join("."), i.message])).toEqual([
      ["lines", "together the lines come to more than 100,000,000.00, the most one quote can hold"],
    ]);
    expect(() =>
      quoteTotals(
        Array.from({ length: 200 }, () => line),
        2000,
      ),
    ).toThrow(RangeError);
  });
});

describe("the sign-in form's e-mail address", () => {
  it("refuses one longer than any sign-in's with the words for a mistyped one (it would otherwise reach the lock-out's index)", () => {
    const at = (n: number) => `${"a".repeat(n - "@example.test".length)}@example.test`;
    expect(credentialsSchema.safeParse({ email: at(200), password: "x" }).success).toBe(true);
    const long = credentialsSchema.safeParse({ email: at(201), password: "x" });
    expect(long.error?.issues.map((i) => i.message)).toEqual(["Enter the e-mail address you sign in with"]);
  });
});
