import "server-only";
import { claimNotices, finishNotice, noticeFacts, type NoticeFacts } from "@/db/review/notices";
import { enqueueMails } from "./mail";
import { officeConfig } from "./office-config";
import type { Db } from "@/db/setup/client";
import type PgBoss from "pg-boss";

// Queues the supervisors' e-mail for sign-offs whose stage has readings out of tolerance. Runs as a
// queue job: handed on after a sync merge has committed (app/api/sync/route.ts) and every minute by
// the sweep, so a notice left waiting goes out on a later run. Reading the review queue sends
// nothing. The e-mails themselves are sent, and retried, by the mail queue (app/_server/mail.ts).

function noticeMail(f: NoticeFacts, signOffId: string, baseUrl: string) {
  const count = f.outOfTolerance.length;
  const subject = `Work order ${f.number}: "${f.stageTitle}" signed off with ${count} reading${count === 1 ? "" : "s"} out of tolerance`;
  const lines = f.outOfTolerance.map((o) => `  - ${o.stepTitle} — ${o.description}`);
  const text = [
    `${f.signedBy.name} signed off "${f.stageTitle}" on work order ${f.number} (${f.bike}, tag ${f.tagCode}) at ${f.signedAt.toISOString().replace("T", " ").slice(0, 16)} UTC.`,
    "",
    "Readings out of tolerance:",
    ...lines,
    "",
    `Review it: ${baseUrl}/review/${signOffId}`,
    "",
    "Approve only with a written reason for each reading, or send the steps back to the bench.",
  ].join("\n");
  return { subject, text };
}

export async function queueReviewNotices(db: Db, boss?: PgBoss): Promise<{ queued: number; skipped: number; failed: number }> {
  const tally = { queued: 0, skipped: 0, failed: 0 };
  for (;;) {
    const claimed = await claimNotices(db);
    if (!claimed.length) return tally;
    for (const n of claimed) {
      try {
        const facts = await noticeFacts(db, n);
        if (!facts || facts.decided || facts.outOfTolerance.length === 0 || facts.recipients.length === 0) {
          await finishNotice(db, n, { state: "not_needed" });
          tally.skipped++;
          continue;
        }
        const { subject, text } = noticeMail(facts, n.signOffId, officeConfig().NEXTAUTH_URL);
        const mails = facts.recipients.map((r) => ({
          shopId: n.shopId,
          workOrderId: n.workOrderId,
          kind: "review_needed",
          cause: `sign-off:${n.signOffId}`,
          to: r.email,
          subject,
          text,
        }));
        await enqueueMails(db, mails, boss);
        await finishNotice(db, n, { state: "sent" }, { recipients: facts.recipients.map((r) => r.email), subject });
        tally.queued++;
      } catch (e) {
        await finishNotice(db, n, { state: "retry", error: (e as Error).message }).catch(() => undefined);
        tally.failed++;
      }
    }
    // A notice that could not be queued waits for the next run rather than being tried again at once.
    if (tally.failed) return tally;
  }
}
