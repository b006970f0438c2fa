import { json, publicRoute } from "@/app/_server/route";
import { signedInClaim } from "@/app/_server/signed-in";
import { appendAudit } from "@/db/audit/append";
import { setPasswordFromLink } from "@/db/customer-contact/invitations";
import { setPasswordSchema } from "@/lib/customer-contact/schemas";

// POST: a customer chooses their password with the token of an invitation e-mail. The token is
// the check (no session): setPasswordFromLink refuses, changing nothing, a link that is not ours,
// used, replaced by a newer one, expired, or for another sign-in than the one this browser is
// signed in with.
export const POST = publicRoute(
  {
    check: "invitation-link",
    body: json(setPasswordSchema, { maxBytes: 8 * 1024, labels: { password: "Password", repeat: "Password again" } }),
  },
  async ({ body, db }) => {
    const claim = await signedInClaim();
    const done = await setPasswordFromLink(db, { token: body.token, password: body.password, signedInUserId: claim?.userId ?? null });
    await appendAudit(db, [
      {
        shopId: done.shopId,
        actorId: done.userId,
        action: "user.password-set-from-invitation",
        entity: "user",
        entityId: done.userId,
        outcome: "accepted",
        detail: { linkId: done.linkId },
      },
    ]);
    return { email: done.email };
  },
);
