import { z } from "zod";
import "../zod-issues";
import { safeText } from "../safe-values";

// The bodies of the extra-work and final-bill routes, with ranges and messages in workshop words.

/** Ranges of a supplement line (a finding mid-build is never a whole second engine). */
export const SUPPLEMENT_LIMITS = {
  lines: 50,
  /** hundredths: 0.01 … 1000.00 */
  quantityHundredths: { min: 1, max: 100_000 },
  /** minor units: 0.00 … 1,000,000.00 */
  unitPriceMinor: { min: 0, max: 100_000_000 },
  photos: 12,
  comment: 1000,
} as const;

const wholeNumber = (label: string, min: number, max: number, minText: string, maxText: string) =>
  z
    .number({ error: `${label}: enter a number.` })
    .refine((n) => Number.isFinite(n), `${label}: enter a number.`)
    .refine((n) => Number.isInteger(n), `${label}: at most two decimals.`)
    .refine((n) => n >= min, `${label}: at least ${minText}.`)
    .refine((n) => n <= max, `${label}: at most ${maxText}.`);

const supplementLineSchema = z.object({
  kind: z.enum(["part", "labour"], "Kind: choose part or labour."),
  description: safeText({ label: "Description", min: 2, max: 200 }),
  partNumber: safeText({ label: "Part number", max: 60 })
    .transform((v) => (v === "" ? null : v))
    .nullable()
    .default(null),
  quantityHundredths: wholeNumber("Quantity", 1, SUPPLEMENT_LIMITS.quantityHundredths.max, "0.01", "1000"),
  unitPriceMinor: wholeNumber("Unit price", 0, SUPPLEMENT_LIMITS.unitPriceMinor.max, "0.00", "1,000,000.00"),
});

export const supplementSchema = z.object({
  finding: safeText({
    label: "Finding",
    min: 3,
    max: 4000,
    multiline: true,
    tooShort: "Finding: say what was found (at least 3 characters).",
  }),
  lines: z
    .array(supplementLineSchema, "Lines: add at least one line.")
    .min(1, "Lines: add at least one line.")
    .max(SUPPLEMENT_LIMITS.lines, `Lines: at most ${SUPPLEMENT_LIMITS.lines}.`),
  photoIds: z
    .array(z.uuid("Photos: choose photos of this job."))
    .max(SUPPLEMENT_LIMITS.photos, `Photos: at most ${SUPPLEMENT_LIMITS.photos}.`)
    .default([]),
});
export type SupplementInput = z.input<typeof supplementSchema>;

const decisionSchema = z.object({
  lineId: z.uuid("Line: not a line of this extra work."),
  decision: z.enum(["approved", "declined"], "Answer: choose approve or decline."),
  comment: safeText({ label: "Comment", max: SUPPLEMENT_LIMITS.comment, multiline: true }).default(""),
});

/** The customer's answers: one per line still waiting (every line of the supplement that has no answer yet). */
export const decisionsSchema = z.object({
  decisions: z
    .array(decisionSchema, "Answers: answer each line.")
    .min(1, "Answers: answer each line.")
    .max(SUPPLEMENT_LIMITS.lines, "Answers: too many.")
    .refine((d) => new Set(d.map((x) => x.lineId)).size === d.length, "Answers: one answer per line."),
});
export type DecisionsInput = z.input<typeof decisionsSchema>;

export const linkDecisionsSchema = decisionsSchema.extend({
  token: z.string("Link: open the link from your e-mail again.").regex(/^[A-Za-z0-9_-]{43}$/, "Link: this is not a link we sent."),
});

export const quoteDeclineSchema = z.object({
  comment: safeText({ label: "Comment", max: SUPPLEMENT_LIMITS.comment, multiline: true }).default(""),
});

export const billChoicesSchema = z.object({
  labour: z
    .array(
      z.object({
        lineId: z.uuid("Labour line: not a line of this job."),
        basis: z.enum(["quoted", "clocked"], "Labour: choose as quoted or as clocked."),
      }),
    )
    .max(500)
    .default([]),
  addParts: z
    .array(
      z.object({
        partFittedId: z.uuid("Part: not a part fitted to this job."),
        unitPriceMinor: wholeNumber("Unit price of the added part", 0, SUPPLEMENT_LIMITS.unitPriceMinor.max, "0.00", "1,000,000.00"),
      }),
    )
    .max(500)
    .refine((a) => new Set(a.map((x) => x.partFittedId)).size === a.length, "Parts: each fitted part can be added once.")
    .default([]),
});
export type BillChoicesInput = z.input<typeof billChoicesSchema>;
