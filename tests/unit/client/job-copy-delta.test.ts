// fake-indexeddb before dexie: dexie takes the IndexedDB it finds when it loads.
import "fake-indexeddb/auto";
import { describe, expect, it } from "vitest";
import { storeJobCopy } from "@/lib/client/bench-store";
import { refreshJobCopy } from "@/lib/client/sync-client";
import type { JobSnapshot } from "@/lib/sync/snapshot";
import { buildSnapshotDelta, sectionDigests, snapshotDigest, type SnapshotDelta } from "@/lib/sync/snapshot-delta";
import { freshDb } from "../support/tablet-db";
import { completion, ids, jobSnapshot, u } from "../support/job-snapshot";

// The tablet's side of fetching only what changed in a job (lib/sync/snapshot-delta.ts), against a
// stand-in server that answers the way the route does: unchanged, a delta, or the whole copy.

function server(record: JobSnapshot, newIds: string[], tamper: (d: SnapshotDelta) => SnapshotDelta = (d) => d) {
  const requests: Array<Record<string, string>> = [];
  const fetchFn = (async (input: RequestInfo | URL, init?: RequestInit) => {
    expect(String(input)).toBe(`/api/bench/jobs/${ids.job}`);
    const h = new Headers(init?.headers);
    requests.push(Object.fromEntries(h.entries()));
    const digests = await sectionDigests(record);
    const digest = await snapshotDigest(digests);
    const have = h.get("x-bench-have");
    if (!have) return Response.json(record);
    if ((await snapshotDigest(have.split("."))) === digest) return Response.json({ cursor: record.cursor, unchanged: true });
    const delta = await buildSnapshotDelta(record, digests, have.split("."), {
      since: BigInt(h.get("x-bench-since")!),
      operationIds: new Set(newIds),
    });
    return Response.json({ cursor: record.cursor, delta: tamper(delta) });
  }) as typeof fetch;
  return { fetchFn, requests };
}

const held = () => jobSnapshot({ completions: [completion(u(501), ids.stepBore, "9")] }, "10");
const record = () => jobSnapshot({ completions: [completion(u(501), ids.stepBore, "9"), completion(u(502), ids.stepBolts, "11")] }, "12");

describe("a job's copy brought up to date with only what changed", () => {
  it("applies the delta to the held copy: the stored copy is the record's, in one request", async () => {
    const db = freshDb();
    await storeJobCopy(db, held());
    const s = server(record(), [u(502)]);
    await refreshJobCopy(db, ids.job, s.fetchFn);
    expect(s.requests).toHaveLength(1);
    expect(s.requests[0]).toMatchObject({
      "x-bench-since": "10",
      "x-bench-have": expect.stringMatching(/^[0-9a-f]{16}(\.[0-9a-f]{16}){13}$/),
    });
    expect((await db.jobs.get(ids.job))!.snapshot).toEqual(record());
  });

  it("nothing changed: the held copy stays, current to the server's cursor", async () => {
    const db = freshDb();
    await storeJobCopy(db, held());
    const s = server({ ...held(), cursor: "15" }, []);
    await refreshJobCopy(db, ids.job, s.fetchFn);
    expect(s.requests).toHaveLength(1);
    expect((await db.jobs.get(ids.job))!.snapshot).toEqual({ ...held(), cursor: "15" });
  });

  it("a delta that does not give the record's digest is not stored: the whole copy is fetched", async () => {
    const db = freshDb();
    await storeJobCopy(db, held());
    const s = server(record(), [u(502)], (d) => ({ ...d, rows: {} }));
    await refreshJobCopy(db, ids.job, s.fetchFn);
    expect(s.requests).toHaveLength(2);
    expect(s.requests[1]["x-bench-have"]).toBeUndefined();
    expect((await db.jobs.get(ids.job))!.snapshot).toEqual(record());
  });
});
