// When an invitation link may set a password, and what the customer is told when it may not.
// Pure: the database finds the link and its facts (db/customer-contact/invitations.ts).

/** How long a link works after its e-mail was sent. */
export const INVITATION_LIFETIME_HOURS = 72;

export interface LinkFacts {
  userId: string;
  userActive: boolean;
  expiresAt: Date;
  usedAt: Date | null;
  /** A newer link was sent to the same sign-in (the newest one is the only one that works). */
  newerSent: boolean;
}

export type LinkVerdict = { ok: true } | { ok: false; status: 403 | 404 | 409; reason: LinkRefusal; message: string };
export type LinkRefusal = "unknown" | "used" | "retired" | "expired" | "turned-off" | "other-customer";

const ASK_AGAIN = "Ask the workshop to send you a new invitation.";

export function judgeLink(link: LinkFacts | null, now: Date, signedInUserId: string | null): LinkVerdict {
  const no = (status: 403 | 404 | 409, reason: LinkRefusal, message: string): LinkVerdict => ({ ok: false, status, reason, message });
  if (!link)
    return no(404, "unknown", `This invitation link is not one we sent, or it was copied only in part. Nothing was changed. ${ASK_AGAIN}`);
  if (signedInUserId && signedInUserId !== link.userId)
    return no(
      403,
      "other-customer",
      "This invitation link is for another customer's sign-in, not the one you are signed in with. Nothing was changed. Sign out first if the link was sent to you.",
    );
  if (link.usedAt)
    return no(
      409,
      "used",
      "This invitation link has already been used to set a password. Nothing was changed. Sign in with that password, or ask the workshop for a new invitation.",
    );
  if (link.newerSent)
    return no(
      409,
      "retired",
      "A newer invitation was sent after this one, so this link no longer works. Nothing was changed. Use the link in the newest e-mail.",
    );
  if (now.getTime() >= link.expiresAt.getTime())
    return no(
      409,
      "expired",
      `This invitation link has expired (links work for ${INVITATION_LIFETIME_HOURS} hours). Nothing was changed. ${ASK_AGAIN}`,
    );
  if (!link.userActive) return no(409, "turned-off", "This sign-in has been turned off by the workshop. Nothing was changed.");
  return { ok: true };
}

/** The placeholder an invitation e-mail carries in the outbox; the link replaces it when the e-mail is sent. */
export const LINK_PLACEHOLDER = "[[invitation-link]]";
