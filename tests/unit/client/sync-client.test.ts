// fake-indexeddb before dexie: dexie takes the IndexedDB it finds when it loads.
import "fake-indexeddb/auto";
import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { type BenchDb, readSyncMeta } from "@/lib/client/bench-db";
import { missedCopyCursor, storeJobCopy, workOnTop } from "@/lib/client/bench-store";
import { checkSession } from "@/lib/client/session-end";
import { singleFlight } from "@/lib/client/single-flight";
import { syncOnce } from "@/lib/client/sync-client";
import type { Operation } from "@/lib/sync/operations";
import type { JobSnapshot } from "@/lib/sync/snapshot";
import { buildWorkOrderView } from "@/lib/work-order-record";
import { bolt, freshDb } from "../support/tablet-db";
import { ids, jobSnapshot, torqueRecord, u } from "../support/job-snapshot";

// The sync run (lib/client/sync-client.ts) against a stand-in server: what the tablet keeps when
// the network goes between the sync answer and the job reload, and that runs never overlap.

interface FakeServer {
  fetch: typeof fetch;
  syncRequests: Array<{ cursor: string | null; operations: Operation[] }>;
  /** What GET /api/bench/jobs/<id> does: answer with a copy, or fail as a cut network does. */
  jobCopy: () => Promise<JobSnapshot | "network down"> | JobSnapshot | "network down";
  maxConcurrentRuns: number;
}

function fakeServer(cursorAfter: () => string, jobCopy: FakeServer["jobCopy"]): FakeServer {
  let inSync = 0;
  const server: FakeServer = {
    syncRequests: [],
    jobCopy,
    maxConcurrentRuns: 0,
    fetch: (async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = String(input);
      await new Promise((r) => setTimeout(r, 5));
      if (url === "/api/sync") {
        inSync++;
        server.maxConcurrentRuns = Math.max(server.maxConcurrentRuns, inSync);
        const body = JSON.parse(String(init?.body)) as { cursor: string | null; operations: Operation[] };
        server.syncRequests.push(body);
        await new Promise((r) => setTimeout(r, 20));
        inSync--;
        return Response.json({
          accepted: body.operations.map((o) => o.id),
          duplicates: [],
          refused: [],
          flagged: [],
          changes: [],
          cursor: cursorAfter(),
          more: false,
        });
      }
      if (url === "/api/bench/jobs") return Response.json({ jobs: [] });
      if (url === `/api/bench/jobs/${ids.job}`) {
        const copy = await server.jobCopy();
        if (copy === "network down") throw new TypeError("Failed to fetch");
        return Response.json(copy);
      }
      throw new Error(`unexpected request ${url}`);
    }) as typeof fetch,
  };
  return server;
}

const nextBolt = async (db: BenchDb) => {
  const copy = (await db.jobs.get(ids.job))!.snapshot;
  return buildWorkOrderView(copy, await workOnTop(db, ids.job), Date.now()).steps.find((s) => s.step.id === ids.stepBolts)!.torque[0].next;
};

describe("the network cut between the sync answer and the job reload", () => {
  it("keeps the sent bolts on screen and in the outbox until a fresh copy is stored", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const a = await bolt(db, 1, 1);
    const b = await bolt(db, 1, 2);
    const server = fakeServer(
      () => "12",
      () => "network down",
    );

    await expect(syncOnce(db, "tab-1", server.fetch)).rejects.toThrow("Failed to fetch");
    expect(server.syncRequests[0].operations.map((o) => o.id)).toEqual([a.id, b.id]);
    expect((await db.outbox.toArray()).map((e) => e.state)).toEqual(["sent", "sent"]);
    expect(await nextBolt(db)).toEqual({ passIndex: 2, bolt: 1, positionInPass: 0 }); // never bolt 1 of pass 1 again
    expect((await readSyncMeta(db)).lastError).toBe("No network: work is kept on this tablet.");
    expect(await missedCopyCursor(db, ids.job)).toBe("12"); // the bench says its copy is older

    // The network is back: the next run sends nothing again and stores the fresh copy.
    server.jobCopy = () => jobSnapshot({ torqueRecords: [torqueRecord(a.id, 1, 1), torqueRecord(b.id, 1, 2)] }, "12");
    await syncOnce(db, "tab-1", server.fetch);
    expect(server.syncRequests[1].operations).toEqual([]);
    expect(await db.outbox.count()).toBe(0);
    expect(await nextBolt(db)).toEqual({ passIndex: 2, bolt: 1, positionInPass: 0 });
    expect((await db.jobs.get(ids.job))!.snapshot.cursor).toBe("12");
    expect(await missedCopyCursor(db, ids.job)).toBeNull();
  });

  it("a copy older than the one held, answered late, does not replace it", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const a = await bolt(db, 1, 1);
    const other = randomUUID();
    // The reload is answered with a copy at cursor 11, but while it was on its way a newer copy
    // (13: another tablet's bolt too) reached the tablet by another path (the job being opened).
    const server = fakeServer(
      () => "11",
      async () => {
        await storeJobCopy(db, jobSnapshot({ torqueRecords: [torqueRecord(a.id, 1, 1), torqueRecord(other, 1, 2)] }, "13"));
        return jobSnapshot({ torqueRecords: [torqueRecord(a.id, 1, 1)] }, "11");
      },
    );
    await syncOnce(db, "tab-1", server.fetch);
    expect((await db.jobs.get(ids.job))!.snapshot.cursor).toBe("13");
    expect(await db.outbox.count()).toBe(0);
    expect(await nextBolt(db)).toEqual({ passIndex: 2, bolt: 1, positionInPass: 0 });
  });
});

describe("one sync run at a time", () => {
  it("triggers during a run ask for one more run after it, never a parallel one", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    let cursor = 10;
    const server = fakeServer(
      () => String(++cursor),
      () => jobSnapshot({}, String(cursor)),
    );
    const runner = singleFlight(() => syncOnce(db, "tab-1", server.fetch));
    await bolt(db, 1, 1);
    const first = runner.run(); // a save
    while (server.syncRequests.length === 0) await new Promise((r) => setTimeout(r, 1));
    await bolt(db, 1, 2); // recorded while the first run is on the wire
    const second = runner.run(); // the next save, while the first run is going
    const third = runner.run(); // the timer, the online event, the button…
    expect(second).toBe(third);
    await Promise.all([first, second, third]);
    expect(server.syncRequests).toHaveLength(2);
    expect(server.maxConcurrentRuns).toBe(1);
    expect(server.syncRequests.map((r) => r.operations.length)).toEqual([1, 1]);
    expect(server.syncRequests[1].cursor).toBe("11");
    expect(await db.outbox.count()).toBe(0);
  });
});

describe("a change the office makes to a job the tablet holds", () => {
  /** A server whose job list and job copy are the test's; counts the copies fetched. */
  function officeServer(listed: () => unknown[], copy: () => JobSnapshot) {
    const s = { copiesFetched: 0 };
    const fetchFn = (async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = String(input);
      if (url === "/api/sync") {
        const body = JSON.parse(String(init?.body)) as { cursor: string | null };
        return Response.json({
          accepted: [],
          duplicates: [],
          refused: [],
          flagged: [],
          changes: [],
          cursor: body.cursor ?? "10",
          more: false,
        });
      }
      if (url === "/api/bench/jobs") return Response.json({ jobs: listed() });
      if (url === `/api/bench/jobs/${ids.job}`) {
        s.copiesFetched++;
        return Response.json(copy());
      }
      throw new Error(`unexpected request ${url}`);
    }) as typeof fetch;
    return { s, fetchFn };
  }
  const summary = (over: Record<string, unknown>) => {
    const w = jobSnapshot().workOrder;
    return {
      id: w.id,
      number: w.number,
      title: w.title,
      status: w.status,
      statusLabel: w.statusLabel,
      assignedMechanic: w.assignedMechanic,
      assignedToMe: w.assignedToMe,
      mayWork: w.mayWork,
      bike: jobSnapshot().bike,
      updatedAt: new Date().toISOString(),
      ...over,
    };
  };
  const withWorkOrder = (over: Partial<JobSnapshot["workOrder"]>): JobSnapshot => {
    const c = jobSnapshot({}, "10");
    return { ...c, workOrder: { ...c.workOrder, ...over } };
  };

  it("a job given to another mechanic is fetched again, once: the copy then says whose it is", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const other = { id: u(7), name: "Priya" };
    const now = withWorkOrder({ assignedMechanic: other, assignedToMe: false, mayWork: false });
    const { s, fetchFn } = officeServer(
      () => [summary({ assignedMechanic: other, assignedToMe: false, mayWork: false })],
      () => now,
    );
    await syncOnce(db, "tab-1", fetchFn);
    expect(s.copiesFetched).toBe(1);
    expect((await db.jobs.get(ids.job))!.snapshot.workOrder).toMatchObject({ assignedMechanic: other, mayWork: false });
    await syncOnce(db, "tab-1", fetchFn);
    expect(s.copiesFetched).toBe(1);
  });

  it("a job moved off the bench (it leaves the list) is fetched again, once: the copy then says where it stands", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const ready = withWorkOrder({ status: "ready", statusLabel: "Ready for collection", openForBenchWork: false });
    const { s, fetchFn } = officeServer(
      () => [],
      () => ready,
    );
    await syncOnce(db, "tab-1", fetchFn);
    expect(s.copiesFetched).toBe(1);
    expect((await db.jobs.get(ids.job))!.snapshot.workOrder).toMatchObject({ status: "ready", openForBenchWork: false });
    await syncOnce(db, "tab-1", fetchFn);
    expect(s.copiesFetched).toBe(1);
  });

  it("a copy that says what the list says is not fetched again", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const { s, fetchFn } = officeServer(
      () => [summary({})],
      () => jobSnapshot({}, "10"),
    );
    await syncOnce(db, "tab-1", fetchFn);
    expect(s.copiesFetched).toBe(0);
  });
});

describe("a bench left open after another person signed in in another tab", () => {
  it("sends nothing under the other sign-in: the run stops, the work stays waiting, the session check says so", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const a = await bolt(db, 1, 1);
    const requests: string[] = [];
    const fetchFn = (async (input: RequestInfo | URL) => {
      requests.push(String(input));
      if (String(input) === "/api/me") return Response.json({ id: u(55), name: "Priya", role: "mechanic" });
      throw new Error(`unexpected request ${String(input)}`);
    }) as typeof fetch;

    await expect(syncOnce(db, "tab-1", fetchFn, { userId: ids.mech })).rejects.toThrow(/signed in as someone else/);
    expect(requests).toEqual(["/api/me"]);
    expect((await db.outbox.get(a.id))!.state).toBe("waiting");
    expect((await readSyncMeta(db)).lastError).toMatch(/signed in as someone else/);
    expect(await checkSession(fetchFn, ids.mech)).toBe("someone-else");
    expect(await checkSession(fetchFn, u(55))).toBe("open");
  });
});

describe("photo bytes", () => {
  const syncAnswer = (init?: RequestInit) => {
    const body = JSON.parse(String(init?.body)) as { cursor: string | null };
    return Response.json({ accepted: [], duplicates: [], refused: [], flagged: [], changes: [], cursor: body.cursor ?? "10", more: false });
  };
  const addPhoto = (db: BenchDb, id: string) =>
    db.photos.add({
      id,
      workOrderId: ids.job,
      stepId: ids.stepBore,
      blob: new Blob([new Uint8Array([1, 2, 3])], { type: "image/jpeg" }),
      contentType: "image/jpeg",
      byteSize: 3,
      caption: "",
      uploaded: 0,
      createdAt: Date.now(),
    });

  it("are sent even when a job's copy cannot be had: one job's trouble holds back no photo; the run still reports it", async () => {
    const db = freshDb();
    const photoId = u(301);
    await addPhoto(db, photoId);
    const posted: string[] = [];
    const fetchFn = (async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = String(input);
      if (url === "/api/sync") return syncAnswer(init);
      if (url === "/api/bench/jobs") return Response.json({ jobs: [] });
      if (url === `/api/bench/photos/${photoId}`) {
        posted.push(photoId);
        return new Response(null, { status: 201 });
      }
      if (url.startsWith("/api/bench/jobs/")) return Response.json({ error: "broken copy", issues: [] }, { status: 500 });
      throw new Error(`unexpected request ${url}`);
    }) as typeof fetch;
    // the tablet wants a fresh copy of a job the server fails on
    await db.wanted.put({ id: ids.job, cursor: "99", since: Date.now() });
    await expect(syncOnce(db, "tab-1", fetchFn)).rejects.toThrow(/broken copy/);
    expect(posted).toEqual([photoId]);
    expect((await db.photos.get(photoId))?.uploaded).toBe(1);
  });

  it("the server refuses keep its words on the photo and are not sent again with every sync", async () => {
    const db = freshDb();
    const photoId = u(302);
    await addPhoto(db, photoId);
    let posts = 0;
    const fetchFn = (async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = String(input);
      if (url === "/api/sync") return syncAnswer(init);
      if (url === "/api/bench/jobs") return Response.json({ jobs: [] });
      if (url === `/api/bench/photos/${photoId}`) {
        posts++;
        return Response.json({ error: "That file is not a JPEG, PNG or WebP photo.", issues: [] }, { status: 415 });
      }
      throw new Error(`unexpected request ${url}`);
    }) as typeof fetch;
    await syncOnce(db, "tab-1", fetchFn);
    await syncOnce(db, "tab-1", fetchFn);
    expect(posts).toBe(1);
    const kept = await db.photos.get(photoId);
    expect(kept?.uploaded).toBe(0);
    expect(kept?.refusedReason).toBe("That file is not a JPEG, PNG or WebP photo.");
  });
});
