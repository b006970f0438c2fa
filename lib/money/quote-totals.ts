// Quote arithmetic in integer minor units (pence, cents). Pure.
//
// Rounding rule (documented in README):
//  - quantities carry at most two decimals and are held as hundredths (2.5 h → 250);
//  - a line total is quantity × unit price, rounded half-up to the minor unit;
//  - tax is charged ONCE on the quote subtotal (not per line): subtotal × rate / 10 000,
//    rounded half-up to the minor unit (amounts are never negative, so half-up = half away from 0);
//  - total = subtotal + tax.

interface QuoteLineInput {
  quantityHundredths: number;
  unitPriceMinor: number;
}

export interface QuoteTotals {
  lineTotals: number[];
  subtotalMinor: number;
  taxMinor: number;
  totalMinor: number;
}

// The largest amount we accept anywhere, so every product below stays an exact integer in a double.
export const MAX_MINOR = 100_000_000_00; // 100 million in major units
/** The largest quantity of a quote line, in hundredths (100,000.00). */
export const MAX_QUANTITY_HUNDREDTHS = 100_000_00;
const MAX_TAX_RATE_BP = 10_000;

const within = (v: number, min: number, max: number) => Number.isInteger(v) && v >= min && v <= max;

function assertInt(name: string, v: number, min: number, max: number): void {
  if (!within(v, min, max)) throw new RangeError(`${name} must be a whole number from ${min} to ${max}, got ${v}`);
}

// round(numerator / denominator) with halves going up, for non-negative integers.
export function divideHalfUp(numerator: number, denominator: number): number {
  assertInt("numerator", numerator, 0, Number.MAX_SAFE_INTEGER);
  assertInt("denominator", denominator, 1, Number.MAX_SAFE_INTEGER);
  const q = Math.floor(numerator / denominator);
  const r = numerator - q * denominator;
  return r * 2 >= denominator ? q + 1 : q;
}

export function lineTotalMinor(line: QuoteLineInput): number {
  assertInt("quantity (hundredths)", line.quantityHundredths, 1, MAX_QUANTITY_HUNDREDTHS);
  assertInt("unit price", line.unitPriceMinor, 0, MAX_MINOR);
  // quantity ≤ 100 000.00 and price ≤ 1e10 → product ≤ 1e17 would overflow; split the product.
  const whole = Math.floor(line.quantityHundredths / 100);
  const frac = line.quantityHundredths % 100;
  return whole * line.unitPriceMinor + divideHalfUp(frac * line.unitPriceMinor, 100);
}

/** What a quote's lines are told when together they pass MAX_MINOR (each line may be within range alone). */
export const QUOTE_TOO_LARGE = "together the lines come to more than 100,000,000.00, the most one quote can hold";

/** Whether the lines' subtotal passes MAX_MINOR; lines out of range on their own are left to their own checks. */
export function quoteSubtotalTooLarge(lines: readonly QuoteLineInput[]): boolean {
  let subtotal = 0;
  for (const line of lines) {
    if (!within(line.quantityHundredths, 1, MAX_QUANTITY_HUNDREDTHS) || !within(line.unitPriceMinor, 0, MAX_MINOR)) return false;
    subtotal += lineTotalMinor(line);
    if (subtotal > MAX_MINOR) return true;
  }
  return false;
}

export function quoteTotals(lines: QuoteLineInput[], taxRateBp: number): QuoteTotals {
  assertInt("tax rate (basis points)", taxRateBp, 0, MAX_TAX_RATE_BP);
  const lineTotals = lines.map(lineTotalMinor);
  const subtotalMinor = lineTotals.reduce((a, b) => a + b, 0);
  if (subtotalMinor > MAX_MINOR) throw new RangeError("quote subtotal is larger than Benchtag accepts");
  const taxMinor = divideHalfUp(subtotalMinor * taxRateBp, 10_000);
  return { lineTotals, subtotalMinor, taxMinor, totalMinor: subtotalMinor + taxMinor };
}

// "12.50" style text for a minor-unit amount (two decimals; all our currencies use two).
export function formatMinor(minor: number, currency: string): string {
  const sign = minor < 0 ? "-" : "";
  const abs = Math.abs(minor);
  const major = Math.floor(abs / 100);
  const cents = String(abs % 100).padStart(2, "0");
  const symbol = ({ GBP: "£", EUR: "€", USD: "$" } as Record<string, string>)[currency];
  const grouped = major.toString().replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  return symbol ? `${sign}${symbol}${grouped}.${cents}` : `${sign}${grouped}.${cents} ${currency}`;
}

// "2.5" → 250; refuses more than two decimals instead of rounding what the user typed.
export function parseHundredths(text: string): number | null {
  const m = /^\s*(\d{1,7})(?:\.(\d{1,2}))?\s*$/.exec(text);
  if (!m) return null;
  return Number(m[1]) * 100 + Number((m[2] ?? "").padEnd(2, "0"));
}
