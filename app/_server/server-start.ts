import "server-only";
import { isProductionStart, productionSettingProblems, refusedStartMessage } from "@/lib/setup/production-settings";

/**
 * What the Node.js server does once, before it serves anything (called from instrumentation.ts): a
 * production start with missing or default secrets, or a public address that is not https, is
 * refused with the reasons (lib/setup/production-settings.ts). Then the queue worker starts in this
 * process (e-mails, sign-off notices; ./queue/) unless BENCHTAG_QUEUE_WORKER=off, for a shop that
 * runs it as a process of its own (`npm run worker`).
 */
export async function startServer(): Promise<void> {
  if (isProductionStart(process.env)) {
    const problems = productionSettingProblems(process.env);
    if (problems.length) {
      console.error(refusedStartMessage(problems));
      process.exit(1);
    }
  }
  if (process.env.BENCHTAG_QUEUE_WORKER === "off") return;
  const [{ db }, { startQueueWorker }] = await Promise.all([import("@/db/setup/client"), import("./queue/worker")]);
  // A database that does not answer yet must not stop the app from serving: the worker is tried again.
  const start = (attempt: number): void => {
    startQueueWorker(db())
      .then(() => console.log("[queue] worker started"))
      .catch((e) => {
        console.error(`[queue] worker did not start (try ${attempt}); trying again in 30 s`, e);
        setTimeout(() => start(attempt + 1), 30_000).unref();
      });
  };
  start(1);
}
