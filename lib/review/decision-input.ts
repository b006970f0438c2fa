/**
 * What a supervisor sends to decide on a sign-off, checked with zod at the route. Pure; the review
 * screen checks its form with the same schema before sending.
 */
import { z } from "zod";

const JUSTIFICATION_MIN = 10;
const REASON_MIN = 5;

const acceptanceInputSchema = z.object({
  readingId: z.uuid("not a reading id"),
  justification: z
    .string("write why this reading may stand")
    .trim()
    .min(JUSTIFICATION_MIN, `Write at least ${JUSTIFICATION_MIN} characters: why may this reading stand?`)
    .max(2000, "Keep it under 2000 characters."),
});

const flagAcceptanceInputSchema = z.object({
  operationId: z.uuid("not a flagged entry of this job"),
  justification: z
    .string("write why this entry may stand")
    .trim()
    .min(JUSTIFICATION_MIN, `Write at least ${JUSTIFICATION_MIN} characters: why may this flagged entry stand?`)
    .max(2000, "Keep it under 2000 characters."),
});

/** What accepting one flagged entry on its own takes (a closed job's entry no sign-off can carry: db/review/entry-acceptance.ts). */
export const entryAcceptanceSchema = flagAcceptanceInputSchema.pick({ justification: true });

const common = {
  /** The decision the supervisor saw as the latest on this sign-off (null: none). Guards against two people deciding at once. */
  expectedDecisionId: z.uuid("not a decision id").nullable(),
  /**
   * The job's place in the change sequence the supervisor's screen showed (`seenUpTo` of the review):
   * work on the stage received after it was not seen, so the decision is refused until it is.
   * The decision route requires it; code deciding without a screen (tests, the year's data) leaves it out.
   */
  seenUpTo: z
    .string("Reload the review and decide again: this decision does not say which record you saw.")
    .regex(/^\d{1,18}$/, "Reload the review and decide again: this decision does not say which record you saw.")
    .optional(),
  acceptances: z.array(acceptanceInputSchema).max(200, "At most 200 acceptances at once.").default([]),
  /** Written acceptances of flagged entries (lib/review/flagged-work.ts): every one of the stage's is needed to approve. */
  flagAcceptances: z.array(flagAcceptanceInputSchema).max(500, "At most 500 flagged entries at once.").default([]),
};

export const decisionInputSchema = z.discriminatedUnion(
  "decision",
  [
    z.object({ decision: z.literal("approved"), ...common }),
    z.object({
      decision: z.literal("sent_back"),
      ...common,
      reason: z
        .string("say why it goes back")
        .trim()
        .min(REASON_MIN, `Say why it goes back (at least ${REASON_MIN} characters); the mechanic sees this on the step.`)
        .max(2000, "Keep the reason under 2000 characters."),
      reopenStepIds: z.array(z.uuid("not a step id")).min(1, "Choose at least one step to reopen.").max(100),
    }),
  ],
  { error: "Choose approve or send back." },
);

export type DecisionInput = z.output<typeof decisionInputSchema>;

/** What the decision route takes: a decision that says which record the supervisor's screen showed. */
export const decisionRequestSchema = decisionInputSchema.refine((d) => d.seenUpTo !== undefined, {
  path: ["seenUpTo"],
  error: "Reload the review and decide again: this decision does not say which record you saw.",
});
/** What a supervisor decided on a sign-off. */
export type ReviewDecision = DecisionInput["decision"];
