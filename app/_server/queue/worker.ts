import "server-only";
import { strandedMails } from "@/db/mail/outbox";
import { deliverQueuedMail, handToQueue } from "../mail";
import { queueDueReminders } from "../reminder-mail";
import { queueReviewNotices } from "../review-mail";
import { startBoss, type QueueOptions } from "./boss";
import { QUEUES, REMINDERS_CRON } from "./names";
import type { Db } from "@/db/setup/client";
import type PgBoss from "pg-boss";

// The queue worker: sends the outbox's e-mails, turns sign-off notices into e-mails, every ten
// minutes turns reminders that have come due into e-mails, and every minute hands on what was left
// waiting. Started with the app (instrumentation.ts) and runnable on
// its own (`npm run worker`, app/_server/queue/run-worker.ts). Any number of workers may run against
// one database: pg-boss gives each job to one worker at a time, and an e-mail is claimed before it
// is sent (db/mail/outbox.ts), so none is sent twice.

/** How long an e-mail may sit queued without a job before the sweep hands it on again. */
const STRANDED_MS = 60_000;

export async function startQueueWorker(
  db: Db,
  o: QueueOptions & { pollingIntervalSeconds?: number; everyMinuteSweep?: boolean } = {},
): Promise<PgBoss> {
  const boss = await startBoss({ ...o, worker: true });
  const polling = { pollingIntervalSeconds: o.pollingIntervalSeconds ?? 1 };
  await boss.work<{ mailId: string }>(QUEUES.mail, { ...polling, includeMetadata: true }, async ([job]) => {
    return deliverQueuedMail(db, job.data.mailId, job.retryCount >= job.retryLimit);
  });
  await boss.work(QUEUES.reviewNotices, polling, async () => queueReviewNotices(db, boss));
  await boss.work(QUEUES.sweep, polling, async () => sweep(db, boss));
  await boss.work<{ asOf?: string }>(QUEUES.reminders, polling, async ([job]) => queueDueReminders(db, boss, job.data?.asOf));
  if (o.everyMinuteSweep ?? true) {
    await boss.schedule(QUEUES.sweep, "* * * * *");
    await boss.schedule(QUEUES.reminders, REMINDERS_CRON);
  }
  return boss;
}

export async function sweep(db: Db, boss: PgBoss) {
  const notices = await queueReviewNotices(db, boss);
  const stranded = await strandedMails(db, STRANDED_MS);
  await handToQueue(stranded, boss, true);
  return { notices, stranded: stranded.length };
}
