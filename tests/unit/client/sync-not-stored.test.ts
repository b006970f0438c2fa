// fake-indexeddb before dexie: dexie takes the IndexedDB it finds when it loads.
import "fake-indexeddb/auto";
import { describe, expect, it } from "vitest";
import type { BenchDb } from "@/lib/client/bench-db";
import { discardEntry, entriesNeedingAttention, recordOperation, resendEntry, storeJobCopy, workOnTop } from "@/lib/client/bench-store";
import { syncOnce } from "@/lib/client/sync-client";
import { describeEntry } from "@/lib/sync/describe-entry";
import type { Operation } from "@/lib/sync/operations";
import { ids, jobSnapshot } from "../support/job-snapshot";
import { author, bolt, freshDb } from "../support/tablet-db";

// What the tablet does with work the server does not store at once: a batch the server fails on
// is split until the one entry that fails is found (kept as refused with the server's error), the
// rest is stored; a held entry stays on screen and is sent again until it is stored; a refused
// entry is sent again on request, or discarded only once the server has written the discard down.

interface Posted {
  url: string;
  body: { operations?: Operation[]; discards?: Array<{ id: string; reason: string; refusedReason: string }> };
}

/**
 * A stand-in server. `failsOn(op)` makes any batch holding that op fail with 500 (a server fault
 * it cannot get past); `down` makes every sync request fail with 503; `verdict(op)` answers per op.
 */
function server(opts: {
  failsOn?: (op: Operation) => boolean;
  verdict?: (op: Operation) => "accepted" | { refused: string } | { pending: string };
  down?: () => boolean;
}) {
  const posted: Posted[] = [];
  let cursor = 10;
  const fetchFn = (async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = String(input);
    if (url === "/api/sync" || url === "/api/sync/discards") posted.push({ url, body: JSON.parse(String(init?.body)) });
    if (url === "/api/sync") {
      const ops = posted.at(-1)!.body.operations!;
      if (opts.down?.()) return Response.json({ error: "The workshop database is not answering", issues: [] }, { status: 503 });
      if (ops.some((o) => opts.failsOn?.(o)))
        return Response.json({ error: "Something went wrong on our side", issues: [] }, { status: 500 });
      const answer = { accepted: [] as string[], duplicates: [], refused: [] as unknown[], flagged: [], pending: [] as unknown[] };
      for (const o of ops) {
        const v = opts.verdict?.(o) ?? "accepted";
        if (v === "accepted") answer.accepted.push(o.id);
        else if ("refused" in v) answer.refused.push({ id: o.id, reason: v.refused });
        else answer.pending.push({ id: o.id, reason: v.pending });
      }
      cursor += ops.length;
      return Response.json({ ...answer, changes: [], cursor: String(cursor), more: false });
    }
    if (url === "/api/sync/discards") {
      return Response.json({ results: posted.at(-1)!.body.discards!.map((d) => ({ id: d.id, outcome: "discarded" })) });
    }
    if (url === "/api/bench/jobs") return Response.json({ jobs: [] });
    if (url === `/api/bench/jobs/${ids.job}`) return Response.json(jobSnapshot({}, String(cursor)));
    throw new Error(`unexpected request ${url}`);
  }) as typeof fetch;
  const syncPosts = () => posted.filter((p) => p.url === "/api/sync");
  /** The ids the last sync request carried. */
  const lastSent = () =>
    syncPosts()
      .at(-1)!
      .body.operations!.map((o) => o.id);
  return { fetch: fetchFn, posted, syncPosts, lastSent };
}

const note = (db: BenchDb, text: string) =>
  recordOperation(db, author, ids.job, "measurement.recorded", {
    stepId: ids.stepBore,
    specId: ids.boreSpec,
    readingIndex: 0,
    value: "76.004",
    unit: "mm",
    note: text,
  });

describe("a batch the server fails on", () => {
  it("is split until the one entry that fails is found; the rest is stored, that one kept as refused with the server's error", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const ops = [];
    for (let i = 1; i <= 7; i++) ops.push(i === 5 ? await note(db, "poison") : await bolt(db, 1 + (i % 2), 1 + (i % 2)));
    const poison = ops[4];
    const srv = server({ failsOn: (o) => o.id === poison.id });

    const report = await syncOnce(db, "tab-1", srv.fetch);
    expect(report).toMatchObject({ sent: 7, stored: 6, refused: 1 });
    const entries = await db.outbox.toArray();
    expect(entries.map((e) => [e.id, e.state])).toEqual([[poison.id, "refused"]]);
    expect(entries[0].reason).toMatch(
      /^The server could not store this entry \(Something went wrong on our side\)\. It stays on this tablet/,
    );
    // every stored entry went in exactly one successful request; the poison was tried alone
    const sent = srv.syncPosts().flatMap((p) => p.body.operations!.map((o) => o.id));
    expect(new Set(sent)).toEqual(new Set(ops.map((o) => o.id)));
    expect(srv.syncPosts().some((p) => p.body.operations!.length === 1 && p.body.operations![0].id === poison.id)).toBe(true);
    // bounded: a handful of requests for 7 entries, not one per subset
    expect(srv.syncPosts().length).toBeLessThanOrEqual(12);
  });

  it("stops the run (and splits nothing) when the server does not answer an empty batch either", async () => {
    const db = freshDb();
    await bolt(db, 1, 1);
    await bolt(db, 1, 2);
    const srv = server({ down: () => true });
    await expect(syncOnce(db, "tab-1", srv.fetch)).rejects.toThrow(/not answering/);
    expect(srv.syncPosts().map((p) => p.body.operations!.length)).toEqual([2, 0]);
    expect((await db.outbox.toArray()).map((e) => e.state)).toEqual(["waiting", "waiting"]);
  });
});

describe("any server error (5xx) keeps the work: try again, or split", () => {
  it("keeps every entry waiting when each sync answer is a 5xx, ours (JSON) or a proxy's page (no JSON)", async () => {
    for (const [status, body, type] of [
      [500, JSON.stringify({ error: "Something went wrong on our side; nothing was changed. Try again.", issues: [] }), "application/json"],
      [502, "<html><body>Bad gateway</body></html>", "text/html"],
      [503, JSON.stringify({ error: "The workshop database is not answering; nothing was changed.", issues: [] }), "application/json"],
      [504, "upstream timed out", "text/plain"],
    ] as const) {
      const db = freshDb();
      const a = await bolt(db, 1, 1);
      const b = await bolt(db, 1, 2);
      const sent: number[] = [];
      const fetchFn = (async (input: RequestInfo | URL, init?: RequestInit) => {
        if (String(input) !== "/api/sync") throw new Error(`unexpected request ${String(input)}`);
        sent.push((JSON.parse(String(init?.body)) as { operations: unknown[] }).operations.length);
        return new Response(body, { status, headers: { "content-type": type } });
      }) as typeof fetch;
      await expect(syncOnce(db, "tab-1", fetchFn)).rejects.toMatchObject({ name: "SyncHttpError", status });
      // the batch, then the empty probe that tells "the server is failing" from "this batch fails": no split, nothing gone
      expect(sent).toEqual([2, 0]);
      expect((await db.outbox.toArray()).map((e) => `${e.id} ${e.state}`).sort()).toEqual([`${a.id} waiting`, `${b.id} waiting`].sort());
    }
  });

  it("keeps the entries when the server stores a batch but fails on the next page of changes: they go as duplicates next time", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const a = await bolt(db, 1, 1);
    let calls = 0;
    const fetchFn = (async (input: RequestInfo | URL, init?: RequestInit) => {
      if (String(input) !== "/api/sync") throw new Error(`unexpected request ${String(input)}`);
      calls++;
      const ops = (JSON.parse(String(init?.body)) as { operations: Operation[] }).operations;
      if (calls === 1)
        return Response.json({
          accepted: ops.map((o) => o.id),
          duplicates: [],
          refused: [],
          flagged: [],
          pending: [],
          changes: [],
          cursor: "11",
          more: true,
        });
      return new Response("Bad gateway", { status: 502 });
    }) as typeof fetch;
    await expect(syncOnce(db, "tab-1", fetchFn)).rejects.toMatchObject({ status: 502 });
    expect((await db.outbox.get(a.id))?.state).toBe("waiting");
  });
});

describe("held and refused entries", () => {
  it("keeps a held entry on screen and sends it again until the server has applied it", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const a = await bolt(db, 1, 1);
    let applied = false;
    const srv = server({
      verdict: (o) => (o.id === a.id && !applied ? { pending: "Held on the server until the start of timer X arrives" } : "accepted"),
    });
    await syncOnce(db, "tab-1", srv.fetch);
    expect((await db.outbox.get(a.id))?.state).toBe("held");
    expect((await workOnTop(db, ids.job)).map((o) => o.id)).toEqual([a.id]);
    expect((await entriesNeedingAttention(db)).map((e) => e.id)).toEqual([a.id]);
    applied = true;
    await syncOnce(db, "tab-1", srv.fetch);
    expect(srv.lastSent()).toEqual([a.id]);
    expect(await db.outbox.count()).toBe(0);
  });

  it("keeps a refused entry with its reason until sent again (then stored) or discarded with a reason the server took", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const a = await bolt(db, 1, 1);
    const b = await note(db, "taken warm");
    let fixed = false;
    const srv = server({ verdict: () => (fixed ? "accepted" : { refused: "Only a supervisor may override a timer." }) });
    await syncOnce(db, "tab-1", srv.fetch);
    expect((await entriesNeedingAttention(db)).map((e) => [e.id, e.state, e.reason])).toEqual([
      [a.id, "refused", "Only a supervisor may override a timer."],
      [b.id, "refused", "Only a supervisor may override a timer."],
    ]);
    // refused work is not drawn as done, and a sync does not send it again by itself
    expect(await workOnTop(db, ids.job)).toEqual([]);
    await syncOnce(db, "tab-1", srv.fetch);
    expect(srv.syncPosts().at(-1)!.body.operations).toEqual([]);

    fixed = true;
    await resendEntry(db, a.id);
    await discardEntry(db, b.id, "Read again after the block cooled");
    await syncOnce(db, "tab-1", srv.fetch);
    const discards = srv.posted.filter((p) => p.url === "/api/sync/discards");
    expect(discards).toHaveLength(1);
    expect(discards[0].body.discards).toEqual([
      { id: b.id, operation: b, refusedReason: "Only a supervisor may override a timer.", reason: "Read again after the block cooled" },
    ]);
    expect(srv.lastSent()).toEqual([a.id]);
    expect(await db.outbox.count()).toBe(0);
  });

  it("keeps a discard until the server has written it down", async () => {
    const db = freshDb();
    const a = await bolt(db, 1, 1);
    await db.outbox.update(a.id, { state: "refused", reason: "x", refusedAt: 1 });
    await discardEntry(db, a.id, "recorded twice");
    const offline = (async () => {
      throw new TypeError("Failed to fetch");
    }) as typeof fetch;
    await expect(syncOnce(db, "tab-1", offline)).rejects.toThrow();
    expect((await db.outbox.get(a.id))?.state).toBe("discarding");
  });
});

describe("what a refused entry was", () => {
  it("names the kind, job, step and values, showing a NUL and a broken character instead of hiding them", () => {
    const copy = jobSnapshot({}, "10");
    const d = describeEntry(
      {
        kind: "measurement.recorded",
        workOrderId: ids.job,
        deviceTime: "2026-12-02T08:00:00.000Z",
        payload: { stepId: ids.stepBore, specId: ids.boreSpec, readingIndex: 1, value: 76.004, unit: "mm", note: "warm\u0000 \uD800" },
      },
      copy,
    );
    expect(d.what).toBe("Reading");
    expect(d.job).toBe("#1099 · Marlin Sixty Sport (GSW-0099)");
    expect(d.step).toMatch(/^Step 1 · /);
    expect(d.details).toContainEqual({ label: "Value", value: "76.004 mm" });
    expect(d.details).toContainEqual({ label: "Note", value: "warm\u2400 \uFFFD" });
    expect(describeEntry("garbage", undefined).what).toBe("Unreadable entry");
    expect(describeEntry({ kind: "bolt.twice", payload: 3 }, undefined).what).toBe('Entry of kind "bolt.twice"');
  });
});
