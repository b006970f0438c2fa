import "server-only";
import PgBoss from "pg-boss";
import { databaseUrl } from "@/db/setup/config";
import { MAIL_RETRY, QUEUES } from "./names";

export interface QueueOptions {
  connectionString?: string;
  /** Run the maintenance and the cron schedules in this instance (a worker does; a send-only instance need not). */
  worker?: boolean;
  mailRetry?: { retryLimit: number; retryDelay: number; retryBackoff: boolean };
}

// A started pg-boss with our queues created (idempotent: several instances may start together;
// pg-boss takes an advisory lock while it creates or upgrades its schema).
export async function startBoss(o: QueueOptions = {}): Promise<PgBoss> {
  const boss = new PgBoss({
    connectionString: o.connectionString ?? databaseUrl(),
    schema: "pgboss",
    max: 4,
    supervise: o.worker ?? true,
    schedule: o.worker ?? true,
  });
  boss.on("error", (e) => console.error("[queue]", e));
  await boss.start();
  // A worker sets the queues' retry settings; a send-only instance only creates a missing queue.
  const settle = o.worker ?? true;
  const retry = o.mailRetry ?? MAIL_RETRY;
  await ensureQueue(boss, settle, QUEUES.mail, { ...retry, expireInSeconds: 120 });
  await ensureQueue(boss, settle, QUEUES.reviewNotices, { retryLimit: 3, retryDelay: 30, retryBackoff: true });
  await ensureQueue(boss, settle, QUEUES.sweep, { retryLimit: 0 });
  await ensureQueue(boss, settle, QUEUES.reminders, { retryLimit: 2, retryDelay: 60, retryBackoff: true });
  return boss;
}

async function ensureQueue(boss: PgBoss, settle: boolean, name: string, options: Omit<PgBoss.Queue, "name">) {
  if (!(await boss.getQueue(name))) await boss.createQueue(name, { name, ...options });
  else if (settle) await boss.updateQueue(name, { name, ...options });
}

// The app's own instance (kept on globalThis across Next's module copies), started on first use.
const g = globalThis as unknown as { __benchtagBoss?: Promise<PgBoss> };
export function appBoss(): Promise<PgBoss> {
  g.__benchtagBoss ??= startBoss({ worker: false }).catch((e) => {
    g.__benchtagBoss = undefined;
    throw e;
  });
  return g.__benchtagBoss;
}

/** After a sync merge: its sign-off notices are turned into e-mails by a queue job soon (one waiting job is enough). */
export async function handOnReviewNotices(boss?: PgBoss): Promise<void> {
  const b = boss ?? (await appBoss());
  await b.send(QUEUES.reviewNotices, {}, { singletonKey: "after-merge", singletonSeconds: 2 });
}

/** Stops the app's send-only instance (tests; the process's end does it otherwise). */
export async function stopAppBoss(): Promise<void> {
  const b = g.__benchtagBoss;
  g.__benchtagBoss = undefined;
  if (b) await (await b).stop({ graceful: false, wait: true, close: true });
}
