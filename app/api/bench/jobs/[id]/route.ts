import { route } from "@/app/_server/route";
import { jobCopyFor } from "@/db/bench/job-copy";
import { Refusal } from "@/lib/errors";
import { isUuid } from "@/lib/ids";
import { cursorSchema } from "@/lib/sync/operations";
import { haveSchema } from "@/lib/sync/snapshot-delta";

// GET /api/bench/jobs/[id]: one job's copy for the tablet's store. A tablet holding a copy says so
// in headers: x-bench-since (the cursor it is current to) and x-bench-have (its sections' digests).
// The answer is `{ cursor, unchanged: true }` when nothing in the job changed (the copy is now
// current to that cursor), else only what changed (`{ cursor, delta }`, lib/sync/snapshot-delta.ts);
// without them, or with ones that do not read, the whole copy. Every answer carries a cursor at its
// top level, and the record's digest as its ETag.
export const GET = route({ access: { area: "bench" }, params: ["id"] }, async ({ user, params, req, db }) => {
  if (!isUuid(params.id)) throw new Refusal(`"${params.id}" is not a work order id (a UUID).`, 400);
  const since = cursorSchema.safeParse(req.headers.get("x-bench-since"));
  const have = haveSchema.safeParse(req.headers.get("x-bench-have"));
  const copy = await jobCopyFor(db, user, params.id, {
    since: since.success && have.success ? since.data : undefined,
    have: since.success && have.success ? have.data : undefined,
  });
  if (!copy) throw new Refusal(`No work order ${params.id} in this shop.`, 404);
  const headers = { etag: `"${copy.digest}"`, "cache-control": "no-store", "content-type": "application/json" };
  const body =
    copy.kind === "unchanged"
      ? { cursor: copy.cursor, unchanged: true }
      : copy.kind === "delta"
        ? { cursor: copy.delta.cursor, delta: copy.delta }
        : copy.snapshot;
  return new Response(JSON.stringify(body), { headers });
});
