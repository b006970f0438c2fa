import { describe, expect, it } from "vitest";
import { deliverySchema, reservationSchema } from "@/lib/stock/input";

// A delivery as the office types it: every refusal names the field and the rule in workshop words.

const line = (over: Record<string, unknown> = {}) => ({ partNumber: "GS-RB-8", location: "B2", batch: "L1", quantity: 4, ...over });
const messages = (input: unknown) => {
  const r = deliverySchema.safeParse(input);
  return r.success ? [] : r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
};

describe("deliverySchema", () => {
  it("takes a delivery of batch and serial-numbered lines", () => {
    expect(messages({ supplier: "Harbour Pistons", lines: [line(), line({ batch: undefined, serial: "S1", quantity: 1 })] })).toEqual([]);
  });

  it("refuses quantities that would take stock away or are not whole, huge or not numbers", () => {
    expect(messages({ supplier: "H", lines: [line({ quantity: -1 })] })).toEqual([
      "lines.0.quantity: Quantity must be at least 1: a delivery cannot take stock away.",
    ]);
    expect(messages({ supplier: "H", lines: [line({ quantity: 2.5 })] })).toEqual([
      "lines.0.quantity: Quantity must be a whole number from 1 to 100,000.",
    ]);
    expect(messages({ supplier: "H", lines: [line({ quantity: 1e9 })] })).toEqual(["lines.0.quantity: Quantity must be at most 100,000."]);
    expect(messages({ supplier: "H", lines: [line({ quantity: Number.NaN })] })).toEqual([
      "lines.0.quantity: Quantity must be a whole number from 1 to 100,000.",
    ]);
  });

  it("needs a batch or serial number, quantity 1 with a serial, a shelf, and storable text", () => {
    expect(messages({ supplier: "H", lines: [line({ batch: undefined })] })).toEqual([
      "lines.0.batch: Give the batch number or the serial number (or both), so every part fitted can be traced to this delivery.",
    ]);
    expect(messages({ supplier: "H", lines: [line({ serial: "S1", quantity: 2 })] })).toEqual([
      "lines.0.quantity: A serial number names one part: enter each serial-numbered part on its own line, quantity 1.",
    ]);
    expect(messages({ supplier: "H", lines: [line({ location: " " })] })).toEqual([
      "lines.0.location: Shelf: say where the parts are put away.",
    ]);
    expect(messages({ supplier: "H", lines: [line({ batch: "L\u00001" })] })[0]).toMatch(
      /^lines\.0\.batch: Batch number holds a NUL character/,
    );
    expect(messages({ supplier: "H", lines: [] })).toEqual(["lines: A delivery needs at least one line."]);
  });
});

describe("reservationSchema", () => {
  it("refuses putting aside less than one part, in words about putting aside (not about a delivery)", () => {
    const r = reservationSchema.safeParse({ lotId: "7c0c3a52-2d5e-4d7c-9a51-2f1f0b7d8e11", workOrderNumber: 1070, quantity: 0 });
    expect(r.success ? [] : r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`)).toEqual([
      "quantity: Quantity must be at least 1: put aside one part or more.",
    ]);
  });
});
