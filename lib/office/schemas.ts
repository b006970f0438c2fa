import { z } from "zod";
import "../zod-issues";
import { EMAIL_MAX_CHARS } from "../auth/credentials";
import { MAX_MINOR, MAX_QUANTITY_HUNDREDTHS, QUOTE_TOO_LARGE, quoteSubtotalTooLarge } from "../money/quote-totals";
import { WORK_ORDER_STATUSES } from "../work-orders/status";
import { MAX_PART_QUANTITY, PART_TEXT_LIMITS } from "../sync/operations";
import { safeText } from "../safe-values";

// zod schemas for every office form and route body. Messages name the field's problem in
// plain words; the forms show them beside the field.

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `keep it under ${max} characters`)
    .transform((v) => (v === "" ? null : v))
    .nullable()
    .default(null);

export const customerSchema = z.object({
  name: z.string().trim().min(2, "enter the customer's name").max(120, "keep the name under 120 characters"),
  email: z
    .string()
    .trim()
    .toLowerCase()
    .max(EMAIL_MAX_CHARS, `at most ${EMAIL_MAX_CHARS} characters`)
    .refine((v) => v === "" || z.email().safeParse(v).success, "enter a valid e-mail address, or leave it empty")
    .transform((v) => (v === "" ? null : v))
    .nullable()
    .default(null),
  phone: z
    .string()
    .trim()
    .max(40, "keep the phone number under 40 characters")
    .refine((v) => v === "" || /^[+0-9 ()-]{5,}$/.test(v), "use digits, spaces, +, ( ) and - only")
    .transform((v) => (v === "" ? null : v))
    .nullable()
    .default(null),
  notes: z.string().trim().max(2000).default(""),
});
export type CustomerInput = z.input<typeof customerSchema>;

const currentYear = new Date().getUTCFullYear();
const optionalInt = (label: string, min: number, max: number) =>
  z
    .union([z.number(), z.string()])
    .transform((v, ctx) => {
      if (v === "" || v === null) return null;
      const n = typeof v === "number" ? v : Number(v);
      if (!Number.isInteger(n) || n < min || n > max) {
        ctx.addIssue({ code: "custom", message: `${label} must be a whole number from ${min} to ${max}` });
        return z.NEVER;
      }
      return n;
    })
    .nullable()
    .default(null);

const TAG_CODE_PATTERN = /^[A-Z0-9][A-Z0-9-]{2,19}$/;

export const bikeSchema = z.object({
  customerId: z.uuid("choose the owner"),
  make: z.string().trim().min(1, "enter the make").max(60),
  model: z.string().trim().min(1, "enter the model").max(80),
  year: optionalInt("year", 1900, currentYear + 1),
  vin: optionalText(40),
  engineNumber: optionalText(40),
  displacementCc: optionalInt("displacement", 30, 5000),
  colour: optionalText(40),
  tagCode: z
    .string()
    .trim()
    .toUpperCase()
    .refine((v) => v === "" || TAG_CODE_PATTERN.test(v), "a tag code is 3–20 capital letters, digits and dashes")
    .default(""), // empty: the next free shop tag is given
  notes: z.string().trim().max(2000).default(""),
});
export type BikeInput = z.input<typeof bikeSchema>;

export const intakeSchema = z.object({
  bikeId: z.uuid("choose the bike"),
  title: z.string().trim().min(3, "say in a few words what the job is").max(160),
  complaint: z.string().trim().min(3, "write down the customer's complaint or goal").max(4000),
  odometerKm: z.union([z.number(), z.string()]).transform((v, ctx) => {
    const n = typeof v === "number" ? v : v.trim() === "" ? NaN : Number(v);
    if (!Number.isInteger(n) || n < 0 || n > 2_000_000) {
      ctx.addIssue({ code: "custom", message: "enter the odometer reading in km as a whole number" });
      return z.NEVER;
    }
    return n;
  }),
});
export type IntakeInput = z.input<typeof intakeSchema>;

/** An override's reason: at least this many characters and words (a named person writes why). */
export const OVERRIDE_REASON_MIN = { chars: 15, words: 3 } as const;

const overrideSchema = z.object({
  reason: safeText({
    label: "Reason for the override",
    min: OVERRIDE_REASON_MIN.chars,
    max: 2000,
    multiline: true,
    tooShort: `Reason for the override: write at least ${OVERRIDE_REASON_MIN.words} words (${OVERRIDE_REASON_MIN.chars} characters) saying why the job moves on with items open.`,
  }).refine(
    // too short is said once, by the length check above
    (s) =>
      s.length < OVERRIDE_REASON_MIN.chars || s.split(/\s+/u).filter((w) => /[\p{L}\p{N}]/u.test(w)).length >= OVERRIDE_REASON_MIN.words,
    `Reason for the override: write at least ${OVERRIDE_REASON_MIN.words} words saying why the job moves on with items open.`,
  ),
  /** The keys of the open items the office saw when it wrote the reason (lib/work-orders/open-items.ts). */
  openItemKeys: z.array(z.string().max(200, "Open items: not a list from this work order's page.")).max(2000),
});

export const transitionSchema = z.object({
  to: z.enum(WORK_ORDER_STATUSES, "unknown status"),
  note: safeText({ label: "Note", max: 1000, multiline: true }).default(""),
  templateVersionIds: z.array(z.uuid()).max(10).default([]),
  /** Moving to ready or handed over while items are open: the office's written reason. */
  override: overrideSchema.nullable().default(null),
});

export const assignSchema = z.object({ mechanicId: z.uuid("choose a mechanic").nullable() });

const NOTE_KINDS = ["intake", "teardown", "general"] as const;
export type NoteKind = (typeof NOTE_KINDS)[number];

export const noteSchema = z.object({
  kind: z.enum(NOTE_KINDS),
  body: z.string().trim().min(2, "write the finding").max(4000),
});

const QUOTE_LINE_KINDS = ["part", "labour"] as const;
export type QuoteLineKind = (typeof QUOTE_LINE_KINDS)[number];
/** A quote is drafted, sent to the customer, approved by them, or replaced by a newer version. */
export type QuoteStatus = "draft" | "sent" | "approved" | "superseded";
/** A deposit waits for the payment service, is paid, or failed. */
export type DepositStatus = "pending" | "paid" | "failed" | "refunded";

const quoteLineSchema = z.object({
  kind: z.enum(QUOTE_LINE_KINDS, "choose part or labour"),
  description: z.string().trim().min(2, "describe the line").max(200),
  partNumber: optionalText(60),
  quantityHundredths: z
    .number()
    .int("quantity may have two decimals at most")
    .min(1, "quantity must be more than 0")
    .max(MAX_QUANTITY_HUNDREDTHS),
  unitPriceMinor: z.number().int("price may have two decimals at most").min(0, "price cannot be negative").max(MAX_MINOR),
});

export const quoteDraftSchema = z
  .object({
    lines: z.array(quoteLineSchema).min(1, "add at least one line").max(200),
    depositMinor: z.number().int().min(0, "the deposit cannot be negative").max(MAX_MINOR),
    note: z.string().trim().max(2000).default(""),
  })
  .superRefine((q, ctx) => {
    // Each line is within range on its own; together they must stay within what a quote can hold.
    if (quoteSubtotalTooLarge(q.lines)) ctx.addIssue({ code: "custom", path: ["lines"], message: QUOTE_TOO_LARGE });
  });
export type QuoteDraftInput = z.input<typeof quoteDraftSchema>;

export const partFittedSchema = z.object({
  partNumber: z.string().trim().min(1, "enter the part number").max(PART_TEXT_LIMITS.partNumber),
  description: z.string().trim().max(PART_TEXT_LIMITS.description).default(""),
  supplier: z.string().trim().max(PART_TEXT_LIMITS.supplier).default(""),
  serial: optionalText(PART_TEXT_LIMITS.serial),
  batch: optionalText(PART_TEXT_LIMITS.batch),
  quantity: z.number().int().min(1).max(MAX_PART_QUANTITY).default(1),
  stepId: z.uuid().nullable().default(null),
});

export const pageQuerySchema = z.object({
  page: z.coerce.number().int().min(0).max(100_000).default(0),
  size: z.coerce.number().int().min(1).max(100).default(20),
  q: z.string().trim().max(100).default(""),
  sort: z.string().max(40).default(""),
  dir: z.enum(["asc", "desc"]).default("desc"),
  status: z.enum(WORK_ORDER_STATUSES).optional(),
});
