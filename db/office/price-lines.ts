import "server-only";

// What a quote line and an extra-work line have in common: a part or labour, as the office wrote it,
// priced. Both are stored with the same columns (quote_lines, supplement_lines), written from here.

/** A priced line as the office's form sends it (quote draft or extra work). */
export interface PricedLineInput {
  kind: "part" | "labour";
  description: string;
  partNumber: string | null;
  quantityHundredths: number;
  unitPriceMinor: number;
}

/** The line's stored columns (without the quote or extra work it belongs to): its place, what it is, and its total. */
export function pricedLineRow(line: PricedLineInput, position: number, lineTotalMinor: number) {
  return {
    position,
    kind: line.kind,
    description: line.description,
    part_number: line.partNumber,
    quantity_hundredths: line.quantityHundredths,
    unit_price_minor: line.unitPriceMinor,
    line_total_minor: lineTotalMinor,
  };
}
