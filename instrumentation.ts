// Runs once when the server starts, before it serves anything: the start checks and the queue
// worker (app/_server/server-start.ts). They use Node.js alone, so they are imported only in the
// Node.js runtime's branch, which the build leaves out of the Edge runtime's copy of this file.
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { startServer } = await import("@/app/_server/server-start");
    await startServer();
  }
}
