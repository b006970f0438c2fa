/**
 * Discarding a refused entry: the tablet lets go of an entry the server refused (or holds) only
 * after the server has written down what it was and why it goes (POST /api/sync/discards). Pure
 * zod schemas shared by the route and the client.
 */
import { z } from "zod";
import { safeText } from "@/lib/safe-values";
import { DEVICE_ID_PATTERN } from "./hlc";

/** Entries discarded in one request. */
export const MAX_DISCARDS = 500;

const discardSchema = z
  .object({
    /** The entry's id as the tablet holds it (a refused entry's id may be anything the tablet stored). */
    id: z.string().min(1).max(200),
    /** The entry as the tablet holds it: stored as a copy the audit log accepts, whatever it holds. */
    operation: z.unknown(),
    /** Why the server refused it, as the tablet was told (or why it is held). */
    refusedReason: z.string().max(4000),
    /** Why the person discards it. */
    reason: safeText({ label: "Reason for discarding", min: 3, max: 500, multiline: true, tooShort: "say in a few words why it goes" }),
  })
  .strict();

export const discardRequestSchema = z
  .object({
    deviceId: z.string().regex(DEVICE_ID_PATTERN, "must be 1–64 letters, digits or . _ : - starting with a letter or digit"),
    discards: z.array(discardSchema).min(1).max(MAX_DISCARDS),
  })
  .strict();
export type DiscardRequest = z.output<typeof discardRequestSchema>;

export const discardResponseSchema = z.object({
  results: z.array(
    z.object({
      id: z.string(),
      /**
       * discarded: written to the audit log with the reason; the tablet may let it go.
       * stored: the server holds this operation as recorded work (it was stored after all): it is
       * not discarded; the tablet treats it as sent. A recorded entry is withdrawn, never discarded.
       */
      outcome: z.enum(["discarded", "stored"]),
    }),
  ),
});
export type DiscardResponse = z.output<typeof discardResponseSchema>;
