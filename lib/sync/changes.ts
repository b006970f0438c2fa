/**
 * What POST /api/sync answers: the outcome of each operation sent, and what changed elsewhere
 * since the device's cursor. Pure; shared with the client.
 */
import { z } from "zod";
import { formatStamp } from "./hlc";
import { cursorSchema, stampSchema } from "./operations";

/** The device id the server uses in stamps it makes (review decisions). Tablets never use it. */
const SERVER_DEVICE_ID = "server";

// A change carries what the tablet uses: which job to fetch a fresh copy of, the stamp for its
// clock, and where the feed stands. The job's copy (snapshot) holds the content; sending whole
// operations here too would double the traffic of every sync.

/** Another device's operation was stored on a job (`id` is the operation's). */
const operationChangeSchema = z.object({
  type: z.literal("operation"),
  seq: cursorSchema,
  id: z.uuid(),
  workOrderId: z.uuid(),
  stamp: stampSchema,
});

/**
 * A supervisor decided on a sign-off (`id` is the decision's). The steps a send-back reopens come
 * with the job's fresh copy.
 */
const reviewChangeSchema = z.object({
  type: z.literal("review"),
  seq: cursorSchema,
  id: z.uuid(),
  workOrderId: z.uuid(),
  /** Server-made clock stamp at the decision time: pass it to the device clock's `receive`. */
  stamp: stampSchema,
});

const changeSchema = z.discriminatedUnion("type", [operationChangeSchema, reviewChangeSchema]);
export type Change = z.output<typeof changeSchema>;

const outcomeWithReasonSchema = z.object({ id: z.uuid(), reason: z.string() });
/** A refused operation: its id as sent (a malformed one may have none: then "operations.<n>", its place in the batch). */
const refusalSchema = z.object({ id: z.string(), reason: z.string() });

export const syncResponseSchema = z.object({
  /** Stored by this request: remove from the outbox. Includes the flagged ones. */
  accepted: z.array(z.uuid()),
  /** Already stored before this request (a resend): remove from the outbox. */
  duplicates: z.array(z.uuid()),
  /** Not stored, with why and what to do (written to the audit log, whole operation in its detail). */
  refused: z.array(refusalSchema),
  /** Accepted and stored, but marked for a supervisor to look at, with why. Subset of `accepted`. */
  flagged: z.array(outcomeWithReasonSchema),
  /**
   * Held on the server until the record they act on arrives (a correction's reading, a timer's
   * start); applied then, in stamp order. Keep them and send them again with the next batch: the
   * answer says `accepted` or `duplicates` once they are applied. (Absent from older servers.)
   */
  pending: z.array(outcomeWithReasonSchema).default([]),
  /** Changes from elsewhere after the request's cursor, in seq order. */
  changes: z.array(changeSchema),
  /** Send this as `cursor` next time. */
  cursor: cursorSchema,
  /** True when more changes are waiting: sync again (with no operations if the outbox is empty). */
  more: z.boolean(),
});
export type SyncResponse = z.output<typeof syncResponseSchema>;

/**
 * A change this version of the app cannot read: one made by a newer server (a kind of operation
 * added since this tablet loaded the app). The tablet does not fail its sync for it: it reloads
 * the job the change names (its snapshot comes in the shape this version reads) and moves on.
 */
interface UnreadChange {
  type: "unread";
  seq: string | null;
  workOrderId: string | null;
  why: string;
}

const namesAJob = z.looseObject({
  seq: cursorSchema.optional(),
  workOrderId: z.uuid().optional(),
});

export function readChange(raw: unknown): Change | UnreadChange {
  const known = changeSchema.safeParse(raw);
  if (known.success) return known.data;
  const job = namesAJob.safeParse(raw);
  const issue = known.error.issues[0];
  return {
    type: "unread",
    seq: job.success ? (job.data.seq ?? null) : null,
    workOrderId: job.success ? (job.data.workOrderId ?? null) : null,
    why: issue ? `${issue.path.join(".")}: ${issue.message}` : "not a change this version knows",
  };
}

/** The sync answer as a tablet reads it: like {@link syncResponseSchema}, but a change it cannot read does not fail the sync. */
export const tabletSyncResponseSchema = syncResponseSchema.extend({
  changes: z.array(z.unknown()).transform((list) => list.map(readChange)),
});

/** The stamp the server gives a decision made at `decidedAtMs`. */
export function serverStamp(decidedAtMs: number): string {
  return formatStamp({ wallMs: decidedAtMs, counter: 0, deviceId: SERVER_DEVICE_ID });
}
