import { z } from "zod";
import { safeText } from "@/lib/safe-values";
import { DEVICE_ID_PATTERN } from "@/lib/sync/hlc";
import { SYNC_LIMITS } from "@/lib/sync/operations";

// Bodies of the session routes: the tablet naming itself, the office ending sessions or clearing
// a sign-in wait, and a tablet handing over its unsent work after the office ended its session.

export const deviceIdSchema = z.string().regex(DEVICE_ID_PATTERN, "Tablet: 1–64 letters, digits or . _ : -");

export const sessionDeviceSchema = z.object({ deviceId: deviceIdSchema }).strict();

export const endSessionsSchema = z.union([
  z.object({ userId: z.uuid("choose the person") }).strict(),
  z.object({ deviceId: deviceIdSchema }).strict(),
]);

export const clearWaitSchema = z.object({ key: z.string().min(1).max(400) }).strict();

/** The tablet's outbox as it was: entries are kept as sent (they are not merged), so only their count and size are checked. */
export const outboxHandoverSchema = z
  .object({
    deviceId: deviceIdSchema,
    entries: z.array(z.record(z.string(), z.unknown())).max(SYNC_LIMITS.maxOperations),
    photosLeft: z
      .array(
        z.object({
          id: z.string().max(64),
          /** The job it was taken on (tablets before this field: none; such a photo holds no job). */
          workOrderId: z.string().max(64).optional(),
          stepId: z.string().max(64),
          byteSize: z.number().int().nonnegative(),
          caption: z.string().max(400),
        }),
      )
      .max(1000),
  })
  .strict();
export type OutboxHandover = z.output<typeof outboxHandoverSchema>;

/** The office settling a hand-over's entries on one job: what was re-entered on the record, or why nothing needs to be. */
export const handoverSettlementSchema = z
  .object({
    workOrderId: z.uuid("Choose a job of this hand-over."),
    note: safeText({
      label: "Note",
      max: 2000,
      min: 10,
      multiline: true,
      tooShort: "Write at least 10 characters: what was re-entered on the record, or why nothing needs to be.",
    }),
  })
  .strict();
