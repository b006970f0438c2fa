import { route } from "@/app/_server/route";
import { jobCopyFor } from "@/db/bench/job-copy";
import { Refusal } from "@/lib/errors";
import { isUuid } from "@/lib/ids";
import { cursorSchema } from "@/lib/sync/operations";
import { haveSchema } from "@/lib/sync/snapshot-delta";

// GET /api/bench/jobs/[id]: one job's copy for the tablet's store. A tablet holding a copy says so
// in headers: If-None-Match (the copy's ETag), x-bench-since (the cursor it is current to) and
// x-bench-have (its sections' digests). The answer is 304 when nothing in the job changed
// (x-bench-cursor: the cursor the copy is now current to), else only what changed
// (`{ delta }`, lib/sync/snapshot-delta.ts); without them, or with ones that do not read, the
// whole copy. Every answer carries the record's ETag.
export const GET = route({ access: { area: "bench" }, params: ["id"] }, async ({ user, params, req, db }) => {
  if (!isUuid(params.id)) throw new Refusal(`"${params.id}" is not a work order id (a UUID).`, 400);
  const since = cursorSchema.safeParse(req.headers.get("x-bench-since"));
  const have = haveSchema.safeParse(req.headers.get("x-bench-have"));
  const copy = await jobCopyFor(db, user, params.id, {
    since: since.success && have.success ? since.data : undefined,
    have: since.success && have.success ? have.data : undefined,
    etag: req.headers.get("if-none-match"),
  });
  if (!copy) throw new Refusal(`No work order ${params.id} in this shop.`, 404);
  const headers = { etag: `"${copy.digest}"`, "cache-control": "no-store", "content-type": "application/json" };
  if (copy.kind === "unchanged") return new Response(null, { status: 304, headers: { ...headers, "x-bench-cursor": copy.cursor } });
  return new Response(JSON.stringify(copy.kind === "delta" ? { delta: copy.delta } : copy.snapshot), { headers });
});
