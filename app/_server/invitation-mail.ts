import "server-only";
import { INVITATION_LIFETIME_HOURS, LINK_PLACEHOLDER } from "@/lib/customer-contact/invitation-rules";
import { INVITATION_CAUSE_PREFIX, INVITATION_KIND } from "./invitation-link";
import { enqueueMails } from "./mail";
import type { Db } from "@/db/setup/client";

// The invitation e-mail. It is queued with a placeholder where the link goes; the link (and its
// token) is made only when the queue worker sends it (./invitation-link.ts).

export async function mailInvitation(
  db: Db,
  shopId: string,
  invitation: { id: string; email: string; name: string; shopName: string },
): Promise<string[]> {
  return enqueueMails(db, [
    {
      shopId,
      workOrderId: null,
      kind: INVITATION_KIND,
      cause: `${INVITATION_CAUSE_PREFIX}${invitation.id}`,
      to: invitation.email,
      subject: `Set your password for ${invitation.shopName}`,
      text: `Hello ${invitation.name},\n\n${invitation.shopName} has made you a sign-in so you can follow the work on your bike, see its photos and ask us questions.\n\nChoose your password here (the link works once, for ${INVITATION_LIFETIME_HOURS} hours):\n${LINK_PLACEHOLDER}\n\nYou sign in with this e-mail address: ${invitation.email}\n\nIf you did not expect this e-mail, ignore it.\n\n${invitation.shopName}`,
    },
  ]);
}
