import { describe, expect, it } from "vitest";
import { z } from "zod";
import { customerSchema, quoteDraftSchema } from "@/lib/office/schemas";
import { syncBatchSchema } from "@/lib/sync/operations";
import { checkInput, documentPath, issuesOf } from "@/lib/zod-issues";

// zod's own wording never reaches a person: the field is named by its label and the rule said
// plainly; a message written on a schema stays as written.
const ZOD_WORDING = /expected|received|Invalid input|Too big|Too small|<=|>=/;

describe("zod problems in workshop words", () => {
  it("names the field by its label and says the rule", () => {
    const schema = z.object({
      note: z.string().max(4000),
      odometerKm: z.number().int().min(0),
      lines: z.array(z.object({ unitPriceMinor: z.number() })).min(1),
    });
    const r = checkInput(schema, { note: "x".repeat(4001), odometerKm: Number.NaN, lines: [] });
    expect(r).toEqual({
      ok: false,
      issues: [
        { path: "note", message: "Note: at most 4000 characters" },
        { path: "odometerKm", message: "Odometer: is not a number" },
        { path: "lines", message: "Quote lines: add at least one" },
      ],
    });
  });

  it("says missing, wrong kind, whole numbers, limits, choices and formats plainly", () => {
    const schema = z.object({
      quantity: z.number().int().max(1000),
      value: z.number(),
      unit: z.enum(["mm", "in", "µm"]),
      ranOn: z.iso.date(),
      readingId: z.uuid(),
      email: z.email(),
      year: z.number().min(1900),
      inletK: z.number(),
    });
    const r = checkInput(schema, {
      quantity: 2.5,
      value: Infinity,
      unit: "cm",
      ranOn: "0000-13-45",
      readingId: "nope",
      email: "nobody",
      year: 12,
    });
    expect(r.ok).toBe(false);
    const messages = r.ok ? [] : r.issues.map((i) => i.message);
    expect(messages).toEqual([
      "Quantity: must be a whole number",
      "Value: must be a finite number",
      "Unit: choose mm, in or µm",
      "Date: must be a date (YYYY-MM-DD)",
      "Reading: is not a valid id",
      "E-mail: is not a valid e-mail address",
      "Year: must be at least 1900",
      "This entry: is missing",
    ]);
    for (const m of messages) expect(m).not.toMatch(ZOD_WORDING);
    expect(messages.join(" ")).not.toContain("inletK");
  });

  it("keeps the messages written on the schemas", () => {
    const r = checkInput(customerSchema, { name: "" });
    expect(r).toMatchObject({ ok: false, issues: [{ path: "name", message: "enter the customer's name" }] });
    const q = checkInput(quoteDraftSchema, {
      lines: [{ kind: "part", description: "Piston", partNumber: "", quantityHundredths: 0, unitPriceMinor: 10 }],
      depositMinor: 0,
      note: "n".repeat(2001),
    });
    expect(q.ok ? [] : q.issues).toEqual([
      { path: "lines.0.quantityHundredths", message: "quantity must be more than 0" },
      { path: "note", message: "Note: at most 2000 characters" },
    ]);
  });

  it("is the same when a schema is parsed without asking (the map is installed for every parse)", () => {
    const r = customerSchema.safeParse({ name: "Ada Example", notes: "n".repeat(2001) });
    expect(issuesOf(r.error!)).toEqual([{ path: "notes", message: "Notes: at most 2000 characters" }]);
  });

  it("names sync entries' fields for the tablet", () => {
    const r = syncBatchSchema.safeParse({ deviceId: "tab-1", cursor: null, operations: "none" });
    expect(issuesOf(r.error!)).toEqual([{ path: "operations", message: "Entries: must be a list" }]);
  });

  it("writes a document path as it reads in the file", () => {
    expect(documentPath(["stages", 1, "steps", 0, "torque", 0, "unit"])).toBe("stages[1].steps[0].torque[0].unit");
    expect(documentPath([])).toBe("(file)");
  });
});
