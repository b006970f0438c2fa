import { json, publicRoute } from "@/app/_server/route";
import { answerByLink } from "@/db/office/supplements";
import { linkDecisionsSchema } from "@/lib/office/extra-work-schemas";

// Answers to extra work through the e-mailed one-time link. No session needed: the link's token is
// the check (answerByLink: unknown, expired, used, or sent to another customer each say so and
// change nothing). A visitor signed in as a customer must be the one the link was sent to.
export const POST = publicRoute({ check: "answer-link", body: json(linkDecisionsSchema) }, async ({ body, db }) => {
  const asking = await (await import("@/app/_server/session")).lookUpSession(db).catch(() => null);
  const signedInCustomerId = asking && "user" in asking ? (asking.user.customerId ?? null) : null;
  return answerByLink(db, body.token, { decisions: body.decisions }, signedInCustomerId);
});
