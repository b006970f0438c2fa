/**
 * Query parameters of the review queue and the audit log (route handlers check them with these).
 * Unknown sort columns fall back to the default; bad numbers are refused with the field named.
 */
import { z } from "zod";

const page = z.coerce.number("The page must be a number").int().min(0).max(100_000).default(0);
const size = z.coerce.number("The page size must be a number").int().min(1).max(100).default(20);
const dir = z.enum(["asc", "desc"], "The order must be rising or falling").default("desc");
const jobNumber = z
  .string()
  .trim()
  .max(9)
  .regex(/^\d*$/, "The job must be a work order number")
  .transform((v) => (v === "" ? undefined : Number(v)))
  .optional();

const QUEUE_SORTS = ["signed", "job", "bike", "mechanic", "outOfTolerance"] as const;

export const queueQuerySchema = z.object({
  page,
  size,
  dir,
  sort: z.enum(QUEUE_SORTS).catch("signed").default("signed"),
  /** Bike: tag code, make or model (part of it). */
  q: z.string().trim().max(100).default(""),
  job: jobNumber,
  mechanic: z
    .union([z.literal(""), z.uuid("Choose the mechanic from the list")])
    .optional()
    .transform((v) => v || undefined),
  /** "yes": only sign-offs with readings out of tolerance not yet accepted; "no": only those without. */
  outOfTolerance: z
    .enum(["", "yes", "no"], "Out of tolerance must be yes or no")
    .optional()
    .transform((v) => v || undefined),
});
export type QueueQuery = z.output<typeof queueQuerySchema>;

const AUDIT_SORTS = ["at", "job", "actor", "action", "outcome"] as const;

export const auditFilterSchema = z.object({
  job: jobNumber,
  outcome: z
    .enum(["", "accepted", "refused"], "The outcome must be accepted or refused")
    .optional()
    .transform((v) => v || undefined),
  /** What was done: an action name or the start of one ("review", "sync.measurement"). */
  action: z
    .string()
    .trim()
    .max(60)
    .optional()
    .transform((v) => v || undefined),
  /** Free text: actor name or e-mail, device, reason. */
  q: z.string().trim().max(100).default(""),
});
export type AuditFilter = z.output<typeof auditFilterSchema>;

export const auditQuerySchema = auditFilterSchema.extend({
  page,
  size,
  dir,
  sort: z.enum(AUDIT_SORTS).catch("at").default("at"),
});
export type AuditQuery = z.output<typeof auditQuerySchema>;
