import "server-only";
import { makeSupplementLink } from "@/db/office/supplements";
import { officeConfig } from "./office-config";
import type { Db } from "@/db/setup/client";

// The answer link of an extra-work e-mail, made by the queue worker as it sends the e-mail
// (./mail.ts), so the outbox never holds a working link: it holds EXTRA_WORK_LINK_PLACEHOLDER.

export const EXTRA_WORK_KIND = "extra_work";
export const EXTRA_WORK_CAUSE_PREFIX = "supplement:";
export const EXTRA_WORK_LINK_PLACEHOLDER = "[[extra-work-link]]";

export async function withExtraWorkLink(db: Db, cause: string, text: string): Promise<string> {
  if (!cause.startsWith(EXTRA_WORK_CAUSE_PREFIX)) throw new Error(`not an extra-work e-mail: ${cause}`);
  // queued before links were made at send time: it carries its own link already
  if (!text.includes(EXTRA_WORK_LINK_PLACEHOLDER)) return text;
  const token = await makeSupplementLink(db, cause.slice(EXTRA_WORK_CAUSE_PREFIX.length));
  return text.replace(EXTRA_WORK_LINK_PLACEHOLDER, `${officeConfig().NEXTAUTH_URL}/extra-work/${token}`);
}
