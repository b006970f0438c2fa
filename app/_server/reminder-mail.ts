import "server-only";
import { dueReminderMails } from "@/db/aftercare/reminders";
import type { Db } from "@/db/setup/client";
import { enqueueMails } from "./mail";
import type PgBoss from "pg-boss";

/**
 * The reminders job: every reminder that has come due and is not done becomes one e-mail in the
 * outbox (cause "reminder:<id>", stored once however many workers run this at the same time) and
 * is handed to the mail queue. `asOf` (an ISO instant) stands in for now in tests.
 */
export async function queueDueReminders(db: Db, boss: PgBoss, asOf?: string): Promise<{ queued: number }> {
  const at = asOf && Number.isFinite(Date.parse(asOf)) ? new Date(asOf) : undefined;
  const ids = await enqueueMails(db, await dueReminderMails(db, at), boss);
  return { queued: ids.length };
}
