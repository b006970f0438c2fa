// The final bill's arithmetic, in integer minor units. Pure: the office's bill panel draws it
// live from the same function the server issues the bill with (db/office/final-bill.ts).
//
// The rules (stated in README, "The final bill"):
//  - billed: every line of the approved quote, and every supplement line the customer approved;
//    a declined supplement line, and one not answered, is listed and not billed;
//  - a labour line is billed "as quoted" (its quoted hours) or "as clocked", as the office chooses
//    per line. The job's clocked hours (lib/clock/hours.ts: whole minutes, then hundredths of an
//    hour half up) are shared among the billed labour lines in proportion to their quoted hours,
//    largest remainder first (ties: the earlier line), so the shares add up to the clocked total;
//  - a part fitted at the bench that no quote or supplement line names is offered; the office
//    adds it at a unit price it enters (quantity as fitted);
//  - a line total is quantity × unit price, half up to the minor unit (as on a quote);
//  - tax is charged once on the bill's subtotal at the shop's rate: subtotal × rate ÷ 10 000,
//    half up; total = subtotal + tax;
//  - balance = total − deposits paid (below 0: money to give back).
import { divideHalfUp, MAX_MINOR } from "./quote-totals";

export type LabourBasis = "quoted" | "clocked";
/** How a line comes onto the bill: the customer's answer, or added by the office (a fitted part). */
export type BillAnswer = "approved" | "declined" | "no_answer" | "added";

export interface BillSourceLine {
  /** The quote line's or supplement line's id. */
  ref: string;
  source: "quote" | "supplement";
  kind: "part" | "labour";
  description: string;
  partNumber: string | null;
  quantityHundredths: number;
  unitPriceMinor: number;
  answer: "approved" | "declined" | "no_answer";
  /** Which supplement it came from (1, 2, …); null for the quote. */
  supplementNumber: number | null;
}

export interface FittedPart {
  /** parts_fitted id. */
  ref: string;
  partNumber: string;
  description: string;
  quantity: number;
}

export interface BillInput {
  lines: BillSourceLine[];
  /** Parts fitted that no line names (offered for adding). */
  fittedUnquoted: FittedPart[];
  clockedHundredths: number;
  depositsPaidMinor: number;
  taxRateBp: number;
}

export interface BillChoices {
  /** The basis per labour line (by ref); a labour line not named is billed as quoted. */
  labour: Record<string, LabourBasis>;
  /** Fitted parts added, with the unit price the office entered. */
  addParts: Array<{ ref: string; unitPriceMinor: number }>;
}

export interface BillLine {
  ref: string;
  source: "quote" | "supplement" | "fitted_part";
  kind: "part" | "labour";
  description: string;
  partNumber: string | null;
  answer: BillAnswer;
  supplementNumber: number | null;
  labourBasis: LabourBasis | null;
  quotedHundredths: number;
  /** This line's share of the clocked hours (billed labour lines only). */
  clockedHundredths: number | null;
  /** What is billed (0 when not counted). */
  quantityHundredths: number;
  unitPriceMinor: number;
  lineTotalMinor: number;
  counted: boolean;
}

export interface Bill {
  lines: BillLine[];
  subtotalMinor: number;
  taxRateBp: number;
  taxMinor: number;
  totalMinor: number;
  depositsPaidMinor: number;
  balanceDueMinor: number;
  clockedHundredths: number;
}

export class BillTooLarge extends Error {}

/** quantity (hundredths) × unit price, half up to the minor unit; 0 for a quantity of 0. */
export function amountFor(quantityHundredths: number, unitPriceMinor: number): number {
  const whole = Math.floor(quantityHundredths / 100);
  const frac = quantityHundredths % 100;
  return whole * unitPriceMinor + divideHalfUp(frac * unitPriceMinor, 100);
}

/** `total` shared in proportion to `weights` (largest remainder, ties to the earlier): the shares add up to `total`. */
export function shareInProportion(weights: readonly number[], total: number): number[] {
  const sum = weights.reduce((a, b) => a + b, 0);
  if (weights.length === 0) return [];
  if (sum === 0) return weights.map((_, i) => (i === 0 ? total : 0));
  const floors = weights.map((w) => Math.floor((w * total) / sum));
  const rest = weights.map((w, i) => ({ i, r: w * total - floors[i] * sum }));
  let left = total - floors.reduce((a, b) => a + b, 0);
  rest.sort((a, b) => b.r - a.r || a.i - b.i);
  for (const { i } of rest) {
    if (left <= 0) break;
    floors[i] += 1;
    left -= 1;
  }
  return floors;
}

export function buildBill(input: BillInput, choices: BillChoices): Bill {
  const billedLabour = input.lines.filter((l) => l.answer === "approved" && l.kind === "labour");
  const shares = shareInProportion(
    billedLabour.map((l) => l.quantityHundredths),
    input.clockedHundredths,
  );
  const shareOf = new Map(billedLabour.map((l, i) => [l.ref, shares[i]]));
  const lines: BillLine[] = input.lines.map((l) => {
    const counted = l.answer === "approved";
    const basis: LabourBasis | null = counted && l.kind === "labour" ? (choices.labour[l.ref] ?? "quoted") : null;
    const clocked = shareOf.get(l.ref) ?? null;
    const quantity = !counted ? 0 : basis === "clocked" ? (clocked ?? 0) : l.quantityHundredths;
    return {
      ref: l.ref,
      source: l.source,
      kind: l.kind,
      description: l.description,
      partNumber: l.partNumber,
      answer: l.answer,
      supplementNumber: l.supplementNumber,
      labourBasis: basis,
      quotedHundredths: l.quantityHundredths,
      clockedHundredths: clocked,
      quantityHundredths: quantity,
      unitPriceMinor: l.unitPriceMinor,
      lineTotalMinor: counted ? amountFor(quantity, l.unitPriceMinor) : 0,
      counted,
    };
  });
  const fitted = new Map(input.fittedUnquoted.map((p) => [p.ref, p]));
  for (const add of choices.addParts) {
    const p = fitted.get(add.ref);
    if (!p) continue;
    fitted.delete(add.ref); // a part is added once
    const quantity = p.quantity * 100;
    lines.push({
      ref: p.ref,
      source: "fitted_part",
      kind: "part",
      description: p.description || p.partNumber,
      partNumber: p.partNumber,
      answer: "added",
      supplementNumber: null,
      labourBasis: null,
      quotedHundredths: 0,
      clockedHundredths: null,
      quantityHundredths: quantity,
      unitPriceMinor: add.unitPriceMinor,
      lineTotalMinor: amountFor(quantity, add.unitPriceMinor),
      counted: true,
    });
  }
  const subtotalMinor = lines.reduce((sum, l) => sum + l.lineTotalMinor, 0);
  if (subtotalMinor > MAX_MINOR) throw new BillTooLarge("The bill would be larger than Benchtag accepts (100,000,000.00).");
  const taxMinor = divideHalfUp(subtotalMinor * input.taxRateBp, 10_000);
  const totalMinor = subtotalMinor + taxMinor;
  return {
    lines,
    subtotalMinor,
    taxRateBp: input.taxRateBp,
    taxMinor,
    totalMinor,
    depositsPaidMinor: input.depositsPaidMinor,
    balanceDueMinor: totalMinor - input.depositsPaidMinor,
    clockedHundredths: input.clockedHundredths,
  };
}

/** The job's total as agreed: the approved quote and approved supplement lines, labour as quoted, tax once. */
export function agreedTotal(lines: readonly BillSourceLine[], taxRateBp: number) {
  const subtotalMinor = lines
    .filter((l) => l.answer === "approved")
    .reduce((s, l) => s + amountFor(l.quantityHundredths, l.unitPriceMinor), 0);
  const taxMinor = divideHalfUp(subtotalMinor * taxRateBp, 10_000);
  return { subtotalMinor, taxMinor, totalMinor: subtotalMinor + taxMinor };
}
