import { afterAll, beforeAll, inject } from "vitest";
import { startQueueWorker } from "@/app/_server/queue/worker";
import { stopAppBoss } from "@/app/_server/queue/boss";
import type { Db } from "@/db/setup/client";
import type PgBoss from "pg-boss";

// Queue workers on this run's database (pg-boss instances of their own, as separate app instances
// would run them), polling fast and retrying a failed e-mail after 1, 2, 4 … s so tests do not wait
// minutes, and with no every-minute sweep (a test runs it when it means to). The app's send-only instance (appBoss) is pointed at the same database.
export const TEST_MAIL_RETRY = { retryLimit: 2, retryDelay: 1, retryBackoff: true };

export function useQueueWorkers(db: Db, count = 1) {
  const url = inject("databaseUrl");
  process.env.DATABASE_URL = url;
  const workers: PgBoss[] = [];
  beforeAll(async () => {
    for (let i = 0; i < count; i++) {
      workers.push(
        await startQueueWorker(db, {
          connectionString: url,
          pollingIntervalSeconds: 0.5,
          mailRetry: TEST_MAIL_RETRY,
          everyMinuteSweep: false,
        }),
      );
    }
  });
  afterAll(async () => {
    await Promise.all(workers.map((w) => w.stop({ graceful: true, wait: true, close: true, timeout: 10_000 })));
    await stopAppBoss();
  });
  return workers;
}

/** Waits until `check` answers true (the queue works in the background), at most `ms`. */
export async function eventually(check: () => Promise<boolean>, ms = 15_000): Promise<void> {
  const until = Date.now() + ms;
  while (!(await check())) {
    if (Date.now() > until) throw new Error("the queue did not get there in time");
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** Runs `run` with the app's SMTP pointed at a closed port (nothing listens on 9), then points it back. */
export async function withSmtpRefusing<T>(run: () => Promise<T>): Promise<T> {
  const smtp = process.env.SMTP_URL;
  process.env.SMTP_URL = "smtp://127.0.0.1:9";
  try {
    return await run();
  } finally {
    process.env.SMTP_URL = smtp;
  }
}
