import "server-only";
// `npm run worker`: the queue worker as a process of its own (for a shop that runs the web app
// with BENCHTAG_QUEUE_WORKER=off, or wants more than one worker). Stops cleanly on SIGINT/SIGTERM.
import { db } from "@/db/setup/client";
import { startQueueWorker } from "./worker";

const boss = await startQueueWorker(db());
console.log("[queue] worker running");
for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.on(signal, () => {
    void boss
      .stop({ graceful: true, wait: true, timeout: 20_000 })
      .then(() => db().destroy())
      .then(() => process.exit(0));
  });
}
