/**
 * The sync wire format, defined once: the tablets' outbox (IndexedDB) and POST /api/sync both use
 * these zod schemas. Pure (no DB, no React): safe to import in the browser.
 *
 * Numbering conventions:
 * - `readingIndex` counts from 0 (the position in the spec's reading labels; 0 for a single reading);
 * - `passIndex` and `bolt` count from 1, as the torque pass list and the tightening order do.
 */
import { z } from "zod";
import { MEASUREMENT_UNITS, TORQUE_UNITS, type TorqueUnit } from "@/lib/calc/units";
import { isSaneInstant, safeText, saneInstant } from "@/lib/safe-values";
import { DEVICE_ID_PATTERN, STAMP_PATTERN } from "./hlc";
import { canonicalDecimal, decimalOfNumber, heldExactly, MAX_READING_DIGITS, readingValueProblem } from "./reading-value";

/** Limits of one POST /api/sync. A bigger outbox is sent as several batches (see ./batching.ts). */
export const SYNC_LIMITS = {
  /** Operations in one batch. */
  maxOperations: 10_000,
  /** Bytes of the JSON body (8 MiB): 10,000 typical operations take about 4 MB, so both limits hold together. */
  maxBodyBytes: 8 * 1024 * 1024,
  /** Entries in `changes` of one response; when there are more, `more` is true and the client asks again. */
  maxChanges: 5_000,
} as const;

export const OPERATION_KINDS = [
  "step.completed",
  "measurement.recorded",
  "torque.bolt-confirmed",
  "timer.started",
  "timer.stopped",
  "timer.overridden",
  "photo.queued",
  "stage.signed-off",
  "part.fitted",
  "timer.cancelled",
  "entry.withdrawn",
  "clock.on",
  "clock.off",
] as const;
export type OperationKind = (typeof OPERATION_KINDS)[number];

export const PHOTO_CONTENT_TYPES = ["image/jpeg", "image/png", "image/webp", "image/heic", "image/heif"] as const;
/** Largest photo a tablet may queue (bytes). */
export const MAX_PHOTO_BYTES = 50 * 1024 * 1024;

// Ids are made on the tablet (crypto.randomUUID) or by PostgreSQL, both in lower case. PostgreSQL
// takes "ABC…" and "abc…" as the same uuid, the merge's lookups do not: one spelling only.
const id = () => z.uuid({ error: "must be a UUID", abort: true }).regex(/^[0-9a-f-]+$/, "must be a UUID written in lower case");
/** Largest reading, either way, in any length unit (a metre in µm): anything bigger is a slip of the finger or worse. */
export const MAX_READING = 1_000_000;
/** Largest wrench reading in any torque unit. */
export const MAX_WRENCH_READING = 100_000;
// Dates between 2000 and 2099 only: a year 0000 or 275760 passes ISO 8601 but not timestamptz.
const isoTime = (label: string) => saneInstant(label);
const stageKey = z.string().regex(/^[a-z0-9][a-z0-9-]{0,62}$/, "must be a stage key (lower-case letters, digits and dashes)");

const deviceIdSchema = z.string().regex(DEVICE_ID_PATTERN, "must be 1–64 letters, digits or . _ : - starting with a letter or digit");
export const stampSchema = z
  .string()
  .regex(STAMP_PATTERN, 'must be a clock stamp: 15-digit ms, 6-digit counter and the device id, joined by "-"')
  .superRefine((s, ctx) => {
    // The wall time it carries orders the work and is shown as a time: the same years as every date.
    const wall = STAMP_PATTERN.exec(s);
    if (wall && !isSaneInstant(Number(wall[1]))) {
      ctx.addIssue({
        code: "custom",
        message: "Clock stamp: its time must be between the years 2000 and 2099; the tablet's clock may be wrong.",
      });
    }
  });
/** The server's cursor: a decimal sequence number. */
export const cursorSchema = z.string().regex(/^(0|[1-9]\d{0,17})$/, "must be a cursor returned by the server (digits)");

// ---------------------------------------------------------------------------------------------
// Payloads, one per kind
// ---------------------------------------------------------------------------------------------

const stepCompletedPayload = z.object({ stepId: id() }).strict();

/**
 * A number read off an instrument: the decimal text as typed ("0.030"), kept to the digit
 * (./reading-value.ts). A JSON number from a tablet of an earlier version is still taken, as the
 * decimal it prints as.
 */
const typedDecimal = (label: string, example: string) =>
  z
    .union([z.string(), z.number()], { error: `${label}: must be a number as typed on the keypad, e.g. ${example}.` })
    .transform((v, ctx) => {
      const text = typeof v === "number" ? decimalOfNumber(v) : canonicalDecimal(v);
      if (text === null) {
        ctx.addIssue({ code: "custom", message: `${label}: must be a plain decimal number as typed on the keypad, e.g. ${example}.` });
        return z.NEVER;
      }
      if (!heldExactly(text)) {
        ctx.addIssue({
          code: "custom",
          message: `${label}: at most ${MAX_READING_DIGITS} digits; no instrument at the bench reads finer.`,
        });
        return z.NEVER;
      }
      return text;
    });

/** A reading's value, kept to the digit. */
const readingValue = typedDecimal("Value", "0.030");

const measurementRecordedPayload = z
  .object({
    stepId: id(),
    specId: id(),
    readingIndex: z.number().int().min(0).max(63),
    /** As read off the instrument: kept exactly, trailing zeros included, never rounded. */
    value: readingValue,
    unit: z.enum(MEASUREMENT_UNITS),
    note: safeText({ label: "Note", max: 1000, multiline: true }).optional(),
    /** The reading this one corrects (it stays on record). */
    supersedesId: id().optional(),
  })
  .strict()
  .superRefine((p, ctx) => {
    const problem = readingValueProblem(p.value, p.unit);
    if (problem) ctx.addIssue({ code: "custom", path: ["value"], message: problem });
  });

/** Largest wrench reading per unit: no fastener on a motorcycle engine comes near (about 2000 N·m). */
export const WRENCH_READING_LIMIT: Record<TorqueUnit, number> = {
  "N·m": 2000,
  "lbf·ft": 1500,
  "lbf·in": 18000,
  "kgf·m": 200,
};

/**
 * Why a torque figure cannot be right — "Final value: 2500 N·m is beyond any fastener on an engine
 * (the most is 2000 N·m)" — or null within the limit of its unit. `value` is named as given ("31.50").
 */
export function beyondWrenchLimit(what: string, value: number | string, unit: TorqueUnit): string | null {
  const limit = WRENCH_READING_LIMIT[unit];
  return Number(value) > limit ? `${what}: ${value} ${unit} is beyond any fastener on an engine (the most is ${limit} ${unit})` : null;
}

const torqueBoltConfirmedPayload = z
  .object({
    stepId: id(),
    torqueSpecId: id(),
    passIndex: z.number().int().min(1).max(16),
    bolt: z.number().int().min(1).max(1024),
    /** What a reading wrench showed, when one was used: as typed ("31.50"), kept to the digit. */
    wrenchReading: typedDecimal("Wrench reading", "31.50").optional(),
    wrenchUnit: z.enum(TORQUE_UNITS).optional(),
  })
  .strict()
  .refine((p) => (p.wrenchReading === undefined) === (p.wrenchUnit === undefined), {
    message: "Wrench reading: give the reading and its unit together, or neither.",
    path: ["wrenchUnit"],
  })
  .superRefine((p, ctx) => {
    if (p.wrenchReading === undefined || p.wrenchUnit === undefined) return;
    const beyond = beyondWrenchLimit("Wrench reading", p.wrenchReading, p.wrenchUnit);
    if (!(Number(p.wrenchReading) > 0)) {
      ctx.addIssue({ code: "custom", path: ["wrenchReading"], message: "Wrench reading must be above zero." });
    } else if (beyond) {
      ctx.addIssue({ code: "custom", path: ["wrenchReading"], message: `${beyond}; check the wrench and type it again.` });
    }
  });

const timerStartedPayload = z
  .object({
    timerId: id(),
    stepId: id(),
    timerSpecId: id().optional(),
    label: safeText({ label: "Timer name", min: 1, max: 120 }),
    durationS: z
      .number()
      .int()
      .positive()
      .max(7 * 24 * 3600),
    startedAt: isoTime("Timer start"),
  })
  .strict();

const reasonText = safeText({ label: "Reason", min: 3, max: 500, multiline: true, tooShort: "give the reason in a few words" });

/**
 * A timer ended before its time (the heat cycle stopped, the cure interrupted), saying why. A
 * stopped timer never lets the step it holds go ahead early: that step waits for a timer that runs
 * its full time, or a supervisor's override. `reason` is optional on the wire only so that stops
 * from tablets of an earlier version (which had no stop button) stay valid; the bench asks for one.
 */
const timerStoppedPayload = z.object({ timerId: id(), stoppedAt: isoTime("Timer stop"), reason: reasonText.optional() }).strict();

/** A timer started by mistake (wrong step, started twice): it no longer counts, for the hold or the record. */
const timerCancelledPayload = z.object({ timerId: id(), reason: reasonText }).strict();

/**
 * Takes back an entry recorded by mistake: a torque bolt, a step completion, a part fitted, a photo
 * or a stage sign-off, named by its operation id. The entry stays on record, marked withdrawn.
 */
const entryWithdrawnPayload = z.object({ operationId: id(), reason: reasonText }).strict();

/** A supervisor lets the step a timer holds back go ahead before the time is up, saying why. */
const timerOverriddenPayload = z.object({ timerId: id(), reason: reasonText }).strict();

const photoQueuedPayload = z
  .object({
    attachmentId: id(),
    stepId: id(),
    contentType: z.enum(PHOTO_CONTENT_TYPES),
    byteSize: z.number().int().positive().max(MAX_PHOTO_BYTES),
    caption: safeText({ label: "Caption", max: 500 }).optional(),
  })
  .strict();

const stageSignedOffPayload = z.object({ jobProcedureId: id(), stageKey }).strict();

/** Longest texts of a part fitted (the same limits as the office's form). */
export const PART_TEXT_LIMITS = { partNumber: 60, description: 200, serial: 80, batch: 80, supplier: 120 } as const;
/** Most of one part a single record may hold (a box of bolts, not a pallet). */
export const MAX_PART_QUANTITY = 1000;

// One line of text: trimmed, not empty, no line breaks, tabs, NUL, other control characters or broken characters.
const partText = (name: string, max: number, ifEmpty = `enter the ${name}`) =>
  safeText({ label: name.charAt(0).toUpperCase() + name.slice(1), min: 1, max, tooShort: ifEmpty });
const optionalPartText = (name: string, max: number) => partText(name, max, `${name} is empty: enter it, or leave it out`).optional();

/**
 * A part fitted at a step: what went in, and the serial number or batch (lot) number that proves
 * which one. At least one of the two is needed; a serial number names one part, so it comes with
 * quantity 1. `partFittedId` is made on the tablet and becomes the record's id.
 */
export const partFittedPayload = z
  .object({
    partFittedId: id(),
    stepId: id(),
    partNumber: partText("part number", PART_TEXT_LIMITS.partNumber),
    description: partText("description", PART_TEXT_LIMITS.description),
    serial: optionalPartText("serial number", PART_TEXT_LIMITS.serial),
    batch: optionalPartText("batch number", PART_TEXT_LIMITS.batch),
    quantity: z
      .number({ error: "quantity must be a whole number" })
      .int("quantity must be a whole number")
      .min(1, "quantity must be at least 1")
      .max(MAX_PART_QUANTITY, `quantity must be at most ${MAX_PART_QUANTITY}`),
    supplier: optionalPartText("supplier", PART_TEXT_LIMITS.supplier),
  })
  .strict()
  .refine((p) => p.serial !== undefined || p.batch !== undefined, {
    message: "give the serial number or the batch number (or both), so the record shows which part went in",
    path: ["serial"],
  })
  .refine((p) => p.serial === undefined || p.quantity <= 1, {
    message: "a serial number names one part: record each serial-numbered part on its own, with quantity 1",
    path: ["quantity"],
  });

/**
 * A mechanic clocks on a job (time at the bench), optionally naming the stage worked on.
 * `clockId` is made on the tablet; the clock-off names it. Clocking on ends any clock of the same
 * mechanic still running, at this clock-on's time (lib/clock/spans.ts).
 */
const clockOnPayload = z
  .object({
    clockId: id(),
    startedAt: isoTime("Clock-on time"),
    jobProcedureId: id().optional(),
    stageKey: stageKey.optional(),
  })
  .strict()
  .refine((p) => (p.jobProcedureId === undefined) === (p.stageKey === undefined), {
    message: "Stage: name the procedure and the stage together, or neither",
    path: ["stageKey"],
  });

/** The mechanic clocks off the clock `clockId` (its own). A clock-off before the clock-on is refused. */
const clockOffPayload = z.object({ clockId: id(), endedAt: isoTime("Clock-off time") }).strict();

// ---------------------------------------------------------------------------------------------
// Operation and batch
// ---------------------------------------------------------------------------------------------

const common = {
  /** Made on the device (UUID v4 or v7); the same operation sent twice has the same id. */
  id: id(),
  workOrderId: id(),
  authorId: id(),
  deviceId: deviceIdSchema,
  /** The tablet's wall clock when the operation was made (for people; ordering uses `stamp`). */
  deviceTime: isoTime("Tablet time"),
  stamp: stampSchema,
};

const op = <K extends OperationKind, P extends z.ZodType>(kind: K, payload: P) =>
  z.object({ ...common, kind: z.literal(kind), payload }).strict();

export const operationSchema = z.discriminatedUnion("kind", [
  op("step.completed", stepCompletedPayload),
  op("measurement.recorded", measurementRecordedPayload),
  op("torque.bolt-confirmed", torqueBoltConfirmedPayload),
  op("timer.started", timerStartedPayload),
  op("timer.stopped", timerStoppedPayload),
  op("timer.overridden", timerOverriddenPayload),
  op("photo.queued", photoQueuedPayload),
  op("stage.signed-off", stageSignedOffPayload),
  op("part.fitted", partFittedPayload),
  op("timer.cancelled", timerCancelledPayload),
  op("entry.withdrawn", entryWithdrawnPayload),
  op("clock.on", clockOnPayload),
  op("clock.off", clockOffPayload),
]);

export type Operation = z.output<typeof operationSchema>;
export type OperationOf<K extends OperationKind> = Extract<Operation, { kind: K }>;

export const syncBatchSchema = z
  .object({
    deviceId: deviceIdSchema,
    /** The cursor from the last response this device got, or null before its first sync. */
    cursor: cursorSchema.nullable(),
    operations: z.array(operationSchema).max(SYNC_LIMITS.maxOperations),
  })
  .strict();

export type SyncBatch = z.output<typeof syncBatchSchema>;

/**
 * What POST /api/sync checks first: the batch's envelope. Each operation is then checked on its
 * own (./parse-batch.ts), so one malformed operation is refused alone and the rest are merged.
 */
export const syncEnvelopeSchema = z
  .object({
    deviceId: deviceIdSchema,
    cursor: cursorSchema.nullable(),
    operations: z.array(z.unknown()).max(SYNC_LIMITS.maxOperations),
  })
  .strict();
