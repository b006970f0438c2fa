import "server-only";
import { appendAudit } from "@/db/audit/append";
import { recordInvitation } from "@/db/customer-contact/invitations";
import { mailInvitation } from "./invitation-mail";
import type { Db } from "@/db/setup/client";

/** The office sends a customer's sign-in an invitation e-mail (recorded, on the audit log, queued). */
export async function sendInvitation(db: Db, actor: { id: string; shopId: string }, userId: string) {
  const invitation = await recordInvitation(db, actor.shopId, actor.id, userId);
  await mailInvitation(db, actor.shopId, invitation);
  await appendAudit(db, [
    {
      shopId: actor.shopId,
      actorId: actor.id,
      action: "user.invited",
      entity: "user",
      entityId: userId,
      outcome: "accepted",
      detail: { invitationId: invitation.id },
    },
  ]);
  return { invitationId: invitation.id, sentTo: invitation.email };
}
