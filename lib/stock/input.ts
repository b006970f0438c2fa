import { z } from "zod";
import { INT4_MAX, safeText } from "../safe-values";
import { PART_TEXT_LIMITS } from "../sync/operations";

// What the office types when stock comes in, is put aside for a job, or is let go again. Every
// message names the field as the form shows it and the rule broken.

/** Most of one part a single delivery line may bring. */
export const MAX_RECEIPT_QUANTITY = 100_000;
/** Lines in one delivery. */
export const MAX_DELIVERY_LINES = 200;
/** Longest shelf or bin name. */
export const LOCATION_MAX = 60;

const optional = (label: string, max: number) =>
  safeText({ label, max })
    .optional()
    .transform((s) => (s ? s : undefined));

/** A whole count from `min` to `max`; `belowMin` says why less is refused (default: "cannot be below"). */
const wholeCount = (label: string, min: number, max: number, belowMin = `${label} cannot be below ${min}.`) =>
  z
    .number({ error: `${label} must be a whole number from ${min} to ${max.toLocaleString("en-GB")}.` })
    .int(`${label} must be a whole number from ${min} to ${max.toLocaleString("en-GB")}.`)
    .min(min, belowMin)
    .max(max, `${label} must be at most ${max.toLocaleString("en-GB")}.`);

export const deliveryLineSchema = z
  .object({
    partNumber: safeText({ label: "Part number", min: 1, max: PART_TEXT_LIMITS.partNumber }),
    description: safeText({ label: "Description", max: PART_TEXT_LIMITS.description }).default(""),
    location: safeText({ label: "Shelf", min: 1, max: LOCATION_MAX, tooShort: "Shelf: say where the parts are put away." }),
    batch: optional("Batch number", PART_TEXT_LIMITS.batch),
    serial: optional("Serial number", PART_TEXT_LIMITS.serial),
    quantity: wholeCount("Quantity", 1, MAX_RECEIPT_QUANTITY, "Quantity must be at least 1: a delivery cannot take stock away."),
    lowStockAt: wholeCount("Low-stock level", 0, MAX_RECEIPT_QUANTITY).optional(),
  })
  .strict()
  .refine((l) => l.batch !== undefined || l.serial !== undefined, {
    path: ["batch"],
    message: "Give the batch number or the serial number (or both), so every part fitted can be traced to this delivery.",
  })
  .refine((l) => l.serial === undefined || l.quantity === 1, {
    path: ["quantity"],
    message: "A serial number names one part: enter each serial-numbered part on its own line, quantity 1.",
  });
export type DeliveryLine = z.infer<typeof deliveryLineSchema>;

export const deliverySchema = z
  .object({
    supplier: safeText({ label: "Supplier", min: 1, max: PART_TEXT_LIMITS.supplier }),
    reference: safeText({ label: "Delivery note", max: 80 }).default(""),
    lines: z
      .array(deliveryLineSchema, { error: "A delivery needs its lines." })
      .min(1, "A delivery needs at least one line.")
      .max(MAX_DELIVERY_LINES, `A delivery holds at most ${MAX_DELIVERY_LINES} lines: receive the rest as a second delivery.`),
  })
  .strict();
export type DeliveryInput = z.infer<typeof deliverySchema>;

export const reservationSchema = z
  .object({
    lotId: z.string({ error: "Choose the stock to put aside." }).uuid("Choose the stock to put aside."),
    workOrderNumber: z
      .number({ error: "Job must be a job number." })
      .int("Job must be a job number.")
      .min(1, "Job must be a job number.")
      .max(INT4_MAX, "Job must be a job number."),
    quantity: wholeCount("Quantity", 1, MAX_RECEIPT_QUANTITY, "Quantity must be at least 1: put aside one part or more."),
  })
  .strict();
export type ReservationInput = z.infer<typeof reservationSchema>;

export const releaseSchema = z
  .object({ reason: safeText({ label: "Reason", min: 3, max: 500, tooShort: "Reason: say why, at least 3 characters." }) })
  .strict();

export const stockSearchSchema = z.object({
  code: safeText({ label: "Batch or serial number", min: 1, max: 80, tooShort: "Enter a batch or serial number." }),
});
