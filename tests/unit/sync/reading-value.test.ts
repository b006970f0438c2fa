import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { formatStamp } from "@/lib/sync/hlc";
import { operationSchema } from "@/lib/sync/operations";
import { canonicalDecimal, decimalOfNumber, heldExactly, readingValueProblem } from "@/lib/sync/reading-value";
import { readingVerdict } from "@/lib/sync/readings";

const reading = (value: unknown, unit = "mm") => ({
  id: randomUUID(),
  workOrderId: randomUUID(),
  authorId: randomUUID(),
  deviceId: "tab-1",
  deviceTime: "2026-12-03T09:30:00.000Z",
  stamp: formatStamp({ wallMs: 1_796_000_000_000, counter: 0, deviceId: "tab-1" }),
  kind: "measurement.recorded",
  payload: { stepId: randomUUID(), specId: randomUUID(), readingIndex: 0, value, unit },
});
const valueOf = (v: unknown, unit?: string) => {
  const r = operationSchema.safeParse(reading(v, unit));
  return r.success ? (r.data.kind === "measurement.recorded" ? r.data.payload.value : null) : r.error.issues.map((i) => i.message);
};

describe("a reading's value keeps its digits", () => {
  it("keeps trailing zeros as typed: the instrument's resolution is part of the record", () => {
    expect(canonicalDecimal("0.030")).toBe("0.030");
    expect(canonicalDecimal("76.0040")).toBe("76.0040");
    expect(canonicalDecimal("−0.020")).toBe("-0.020"); // the keypad's minus sign
    expect(valueOf("0.030")).toBe("0.030");
    expect(valueOf("76.0040")).toBe("76.0040");
  });

  it("writes it the way PostgreSQL's numeric prints it: no leading zeros, no minus on zero", () => {
    expect(canonicalDecimal("007.50")).toBe("7.50");
    expect(canonicalDecimal("-0.000")).toBe("0.000");
    expect(canonicalDecimal("0")).toBe("0");
  });

  it("refuses what is not a plain decimal as typed on the keypad", () => {
    for (const bad of ["1e3", ".5", "5.", "", "NaN", "Infinity", "0x10", "1,5", "--1"]) expect(canonicalDecimal(bad)).toBeNull();
    expect(valueOf("1e3")).toEqual(["Value: must be a plain decimal number as typed on the keypad, e.g. 0.030."]);
    expect(valueOf(true)).toEqual(["Value: must be a number as typed on the keypad, e.g. 0.030."]);
  });

  it("still takes a number from a tablet of an earlier version, as the decimal it printed", () => {
    expect(valueOf(0.03)).toBe("0.03");
    expect(valueOf(76)).toBe("76");
    expect(decimalOfNumber(1e-7)).toBe("0.0000001");
    expect(decimalOfNumber(1.5e-7)).toBe("0.00000015");
    expect(decimalOfNumber(Number.NaN)).toBeNull();
    expect(valueOf(Number.POSITIVE_INFINITY)).not.toBe("Infinity");
  });

  it("refuses absurd magnitudes per unit, with the reason in workshop words", () => {
    expect(valueOf("2000", "mm")).toBe("2000");
    expect(valueOf("2000.1", "mm")).toEqual([
      "Value: 2000.1 mm is beyond anything on an engine (the most is 2000 mm); check the instrument and type it again.",
    ]);
    expect(valueOf("-99999", "mm")).toEqual([
      "Value: -99999 mm is beyond anything on an engine (the most is 2000 mm); check the instrument and type it again.",
    ]);
    expect(valueOf("81", "in")).toHaveLength(1);
    expect(valueOf("1999999", "µm")).toBe("1999999");
    expect(readingValueProblem("12", "mm")).toBeNull();
  });

  it("takes only values a number holds exactly, so the verdict compares exactly what was typed", () => {
    expect(heldExactly("123456789.012345")).toBe(true); // 15 significant digits
    expect(heldExactly("76.00512345678901")).toBe(true); // the 16 digits an older tablet's number printed
    expect(heldExactly("0.10000000000000001")).toBe(false); // 17 typed digits that no number holds
    expect(readingValueProblem("0.10000000000000001", "mm")).toBe("Value: at most 15 digits; no instrument at the bench reads finer.");
    // trailing zeros are digits as typed: past 15 of them, no reading (and past 16,383 decimal
    // places PostgreSQL's numeric refuses the value)
    expect(heldExactly("0.0300000000000000")).toBe(true); // 15 significant digits, trailing zeros included
    expect(heldExactly("0.03000000000000000")).toBe(false);
    expect(readingValueProblem(`31.5${"0".repeat(20_000)}`, "mm")).toBe(
      "Value: at most 15 digits; no instrument at the bench reads finer.",
    );
  });

  it("gives the exact verdict from the text: a limit reading is in, whatever its trailing zeros (common practice: limits count as in)", () => {
    const spec = { unit: "mm" as const, min: 0.02, max: 0.044, nominal: 0.03 };
    expect(readingVerdict("0.020", "mm", spec)).toBe("in");
    expect(readingVerdict("0.0440", "mm", spec)).toBe("in");
    expect(readingVerdict("0.0441", "mm", spec)).toBe("high");
    expect(readingVerdict("0.0199", "mm", spec)).toBe("low");
    // 0.001 in is exactly 0.0254 mm (1 in = 25.4 mm by definition, NIST SP 811)
    expect(readingVerdict("0.0010", "in", { unit: "mm", min: 0.0254, max: 0.05, nominal: null })).toBe("in");
  });
});
