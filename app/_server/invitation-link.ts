import "server-only";
import { makeInvitationLink } from "@/db/customer-contact/invitations";
import { LINK_PLACEHOLDER } from "@/lib/customer-contact/invitation-rules";
import { officeConfig } from "./office-config";
import type { Db } from "@/db/setup/client";

// The link of an invitation e-mail, made by the queue worker as it sends the e-mail (./mail.ts),
// so the outbox never holds a working link: it holds LINK_PLACEHOLDER.

export const INVITATION_KIND = "customer_invitation";
export const INVITATION_CAUSE_PREFIX = "invitation:";

export async function withInvitationLink(db: Db, cause: string, text: string): Promise<string> {
  if (!cause.startsWith(INVITATION_CAUSE_PREFIX)) throw new Error(`not an invitation e-mail: ${cause}`);
  const token = await makeInvitationLink(db, cause.slice(INVITATION_CAUSE_PREFIX.length));
  return text.replace(LINK_PLACEHOLDER, `${officeConfig().NEXTAUTH_URL}/welcome/${token}`);
}
