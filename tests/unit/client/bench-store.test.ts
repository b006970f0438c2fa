// fake-indexeddb before dexie: dexie takes the IndexedDB it finds when it loads.
import "fake-indexeddb/auto";
import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { type BenchDb } from "@/lib/client/bench-db";
import {
  discardEntry,
  keepSyncAnswer,
  markMissedCopies,
  missedCopyCursor,
  olderCopies,
  photosOfStep,
  recordPhoto,
  storeJobCopy,
  trimSentPhotos,
  waitingOperations,
  workOnTop,
} from "@/lib/client/bench-store";
import { author, bolt, freshDb } from "../support/tablet-db";
import { ids, jobSnapshot } from "../support/job-snapshot";

// The tablet's store rules (lib/client/bench-store.ts) on an in-memory IndexedDB (fake-indexeddb).

const toRefresh = async (db: BenchDb) => (await olderCopies(db)).map((w) => w.id);
const copyCursor = async (db: BenchDb) => (await db.jobs.get(ids.job))?.snapshot.cursor;

describe("a job copy is never replaced by an older one", () => {
  it("keeps the newer copy whichever order they arrive in; a copy at the same cursor replaces", async () => {
    const db = freshDb();
    expect(await storeJobCopy(db, jobSnapshot({}, "12"))).toBe(true);
    expect(await storeJobCopy(db, jobSnapshot({}, "9"))).toBe(false);
    expect(await copyCursor(db)).toBe("12");
    const same = jobSnapshot({}, "12");
    same.workOrder.title = "Bottom end (renamed in the office)";
    expect(await storeJobCopy(db, same)).toBe(true);
    expect((await db.jobs.get(ids.job))!.snapshot.workOrder.title).toBe("Bottom end (renamed in the office)");
    expect(await storeJobCopy(db, jobSnapshot({}, "100"))).toBe(true);
    expect(await copyCursor(db)).toBe("100"); // compared as numbers, not as text ("100" < "12")
  });

  it("two overlapping stores (two sync runs, or a sync and a job opening) end with the newer copy", async () => {
    for (const order of [
      ["15", "11"],
      ["11", "15"],
    ]) {
      const db = freshDb();
      await storeJobCopy(db, jobSnapshot({}, "10"));
      await Promise.all(order.map((c) => storeJobCopy(db, jobSnapshot({}, c))));
      expect(await copyCursor(db)).toBe("15");
    }
  });
});

describe("sent work leaves the outbox only with a copy at least as new as the answer", () => {
  it("stays drawn on top until then, and goes when the fresh copy is stored", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const a = await bolt(db, 1, 1);
    const b = await bolt(db, 1, 2);
    expect((await waitingOperations(db)).map((o) => o.id)).toEqual([a.id, b.id]);

    await keepSyncAnswer(db, {
      deviceId: "tab-1",
      stored: [a.id, b.id],
      refused: [],
      touchedJobs: [ids.job],
      cursor: "14",
      remoteStamps: [],
    });
    expect(await waitingOperations(db)).toEqual([]); // nothing left to send…
    expect((await workOnTop(db, ids.job)).map((o) => o.id)).toEqual([a.id, b.id]); // …but still on screen
    expect(await toRefresh(db)).toEqual([ids.job]);
    expect(await missedCopyCursor(db, ids.job)).toBeNull(); // the run is still fetching: no warning yet
    await markMissedCopies(db); // the run ended without the fresh copy
    expect(await missedCopyCursor(db, ids.job)).toBe("14");

    await storeJobCopy(db, jobSnapshot({}, "13")); // a copy fetched before the answer: not new enough
    expect((await workOnTop(db, ids.job)).length).toBe(2);
    expect(await missedCopyCursor(db, ids.job)).toBe("14");

    await storeJobCopy(db, jobSnapshot({}, "14"));
    expect(await workOnTop(db, ids.job)).toEqual([]);
    expect(await missedCopyCursor(db, ids.job)).toBeNull();
    expect(await toRefresh(db)).toEqual([]);
  });

  it("work recorded after the answer stays waiting, and a refused entry keeps its reason", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const a = await bolt(db, 1, 1);
    const refused = await bolt(db, 1, 2);
    const later = await bolt(db, 2, 1);
    await keepSyncAnswer(db, {
      deviceId: "tab-1",
      stored: [a.id],
      refused: [{ id: refused.id, reason: "Bolt 2 is not on this torque spec" }],
      touchedJobs: [],
      cursor: "11",
      remoteStamps: [],
    });
    await storeJobCopy(db, jobSnapshot({}, "11"));
    const rows = await db.outbox.toArray();
    expect(rows.map((r) => [r.id, r.state, r.reason ?? null]).sort()).toEqual(
      [
        [refused.id, "refused", "Bolt 2 is not on this torque spec"],
        [later.id, "waiting", null],
      ].sort(),
    );
  });

  it("a job changed elsewhere that the tablet holds wants a fresh copy; one it never opened does not", async () => {
    const db = freshDb();
    await storeJobCopy(db, jobSnapshot({}, "10"));
    const stranger = randomUUID();
    await keepSyncAnswer(db, {
      deviceId: "tab-1",
      stored: [],
      refused: [],
      touchedJobs: [ids.job, stranger],
      cursor: "20",
      remoteStamps: [],
    });
    expect(await toRefresh(db)).toEqual([ids.job]);
    expect((await db.meta.get("sync"))?.value).toMatchObject({ cursor: "20" });
  });
});

describe("a photo and its operation", () => {
  it("are written in one transaction: both, or neither", async () => {
    const db = freshDb();
    const blob = new Blob([new Uint8Array([137, 80, 78, 71])], { type: "image/png" });
    const op = await recordPhoto(db, author, ids.job, { stepId: ids.stepBore, blob, contentType: "image/png" });
    expect(op.kind).toBe("photo.queued");
    const photos = await db.photos.toArray();
    expect(photos.map((p) => [p.id, p.byteSize, p.uploaded])).toEqual([[op.kind === "photo.queued" ? op.payload.attachmentId : "", 4, 0]]);

    // An operation the schema refuses (a step id that is not a UUID) leaves no photo behind.
    await expect(recordPhoto(db, author, ids.job, { stepId: "not-a-step", blob, contentType: "image/png" })).rejects.toThrow();
    expect(await db.photos.count()).toBe(1);
    expect(await db.outbox.count()).toBe(1);
  });
});

describe("a discard made while a sync answer is on its way", () => {
  it("stands: the answer refusing or holding the entry again does not undo it, and its reason is kept", async () => {
    const db = freshDb();
    const a = await bolt(db, 1, 1);
    const b = await bolt(db, 1, 2);
    await db.outbox.update(a.id, { state: "held", reason: "Held on the server" });
    await db.outbox.update(b.id, { state: "refused", reason: "Not on this job", refusedAt: 1 });
    // the mechanic discards both while a run that sent them is still waiting for its answer
    await discardEntry(db, a.id, "typed on the wrong bike");
    await discardEntry(db, b.id, "typed on the wrong bike");
    await keepSyncAnswer(db, {
      deviceId: "tab-1",
      stored: [],
      refused: [{ id: b.id, reason: "Not on this job any more" }],
      held: [{ id: a.id, reason: "Held on the server until the entry it acts on arrives" }],
      touchedJobs: [],
      cursor: "14",
      remoteStamps: [],
    });
    const after = await db.outbox.bulkGet([a.id, b.id]);
    expect(after.map((e) => [e!.state, e!.discardReason, e!.reason])).toEqual([
      ["discarding", "typed on the wrong bike", "Held on the server"],
      ["discarding", "typed on the wrong bike", "Not on this job any more"],
    ]);
  });
});

describe("photo bytes already sent", () => {
  it("are cleared once their job left this bench or after a week; a photo not yet sent never is", async () => {
    const db = freshDb();
    const now = Date.UTC(2026, 11, 4, 9);
    const day = 24 * 3600 * 1000;
    const otherJob = randomUUID();
    const blob = new Blob([new Uint8Array([1, 2, 3])], { type: "image/jpeg" });
    const photo = (id: string, workOrderId: string, uploaded: 0 | 1, ageDays: number) => ({
      id,
      workOrderId,
      stepId: ids.stepBore,
      blob,
      contentType: "image/jpeg",
      byteSize: 3,
      caption: "",
      uploaded,
      createdAt: now - ageDays * day,
    });
    await db.photos.bulkAdd([
      photo("sent-fresh", ids.job, 1, 1),
      photo("sent-old", ids.job, 1, 8),
      photo("unsent-old", ids.job, 0, 30),
      photo("sent-left", otherJob, 1, 0),
      photo("unsent-left", otherJob, 0, 0),
    ]);
    expect(await trimSentPhotos(db, new Set([ids.job]), now)).toBe(2);
    expect((await db.photos.toCollection().primaryKeys()).sort()).toEqual(["sent-fresh", "unsent-left", "unsent-old"]);
    // Six more days: the one kept is now over a week old.
    expect(await trimSentPhotos(db, new Set([ids.job]), now + 7 * day)).toBe(1);
    expect((await db.photos.toCollection().primaryKeys()).sort()).toEqual(["unsent-left", "unsent-old"]);
  });
});

describe("a step's photos on this tablet", () => {
  it("are those of this job only: step ids come from templates, so another job's photo at the same step is not shown", async () => {
    const db = freshDb();
    const blob = new Blob([new Uint8Array([137, 80, 78, 71])], { type: "image/png" });
    const here = await recordPhoto(db, author, ids.job, { stepId: ids.stepBore, blob, contentType: "image/png" });
    await recordPhoto(db, author, randomUUID(), { stepId: ids.stepBore, blob, contentType: "image/png" });
    const shown = await photosOfStep(db, ids.job, ids.stepBore);
    expect(shown.map((p) => p.id)).toEqual([here.kind === "photo.queued" ? here.payload.attachmentId : ""]);
  });
});
