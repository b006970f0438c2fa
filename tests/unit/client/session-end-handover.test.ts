// fake-indexeddb before dexie: dexie takes the IndexedDB it finds when it loads.
import "fake-indexeddb/auto";
import { describe, expect, it } from "vitest";
import Dexie from "dexie";
import { discardEntry, markUnstorable } from "@/lib/client/bench-store";
import { letGoOfTablet } from "@/lib/client/session-end";
import { bolt, freshDb } from "../support/tablet-db";

// When the office ends a tablet's session, everything the server has not taken is handed over
// before the store goes: waiting entries, refused ones (with the server's reason) and ones being
// discarded. Entries already stored or held by the server are not sent twice.

interface HandedOver {
  entries: Array<{ id: string; state: string; reason?: string; discardReason?: string }>;
}

function handoverServer(status = 201) {
  const posted: HandedOver[] = [];
  const fetchFn = (async (input: RequestInfo | URL, init?: RequestInit) => {
    if (String(input) === "/api/bench/outbox-handover") posted.push(JSON.parse(String(init?.body)));
    return new Response(JSON.stringify({}), { status });
  }) as typeof fetch;
  return { posted, fetchFn };
}

describe("the tablet lets go of its store", () => {
  it("hands over waiting, refused and being-discarded entries, not stored or held ones, then clears", async () => {
    const db = freshDb();
    const made = [];
    for (let b = 1; b <= 5; b++) made.push(await bolt(db, 1, b));
    const [waiting, refused, discarding, stored, held] = made;
    await markUnstorable(db, refused.id, "Not on this job any more");
    await markUnstorable(db, discarding.id, "Not on this job any more");
    await discardEntry(db, discarding.id, "typed on the wrong bike");
    await db.outbox.update(stored.id, { state: "sent" });
    await db.outbox.update(held.id, { state: "held", reason: "Waiting for the entry it acts on" });
    const { posted, fetchFn } = handoverServer();

    expect(await letGoOfTablet(db, "tab-1", fetchFn)).toBe("cleared");

    expect(posted).toHaveLength(1);
    const sent = posted[0].entries.map((e) => [e.id, e.state, e.reason ?? null, e.discardReason ?? null]);
    expect(sent).toEqual([
      [waiting.id, "waiting", null, null],
      [refused.id, "refused", "Not on this job any more", null],
      [discarding.id, "discarding", "Not on this job any more", "typed on the wrong bike"],
    ]);
    expect(await Dexie.exists(db.name)).toBe(false);
  });

  it("work recorded while the hand-over is on its way is handed over too, in a further round, before the store goes", async () => {
    const db = freshDb();
    const first = await bolt(db, 1, 1);
    const posted: HandedOver[] = [];
    let during: { id: string } | null = null;
    const fetchFn = (async (input: RequestInfo | URL, init?: RequestInit) => {
      if (String(input) === "/api/bench/outbox-handover") {
        posted.push(JSON.parse(String(init?.body)));
        // the mechanic taps another bolt while the first hand-over is on its way
        if (!during) during = await bolt(db, 1, 2);
      }
      return new Response(JSON.stringify({}), { status: 201 });
    }) as typeof fetch;

    expect(await letGoOfTablet(db, "tab-1", fetchFn)).toBe("cleared");

    expect(posted.map((p) => p.entries.map((e) => e.id))).toEqual([[first.id], [during!.id]]);
    expect(await Dexie.exists(db.name)).toBe(false);
  });

  it("keeps everything when the hand-over does not go through", async () => {
    const db = freshDb();
    const refused = await bolt(db, 1, 1);
    await markUnstorable(db, refused.id, "Not on this job any more");
    const { posted, fetchFn } = handoverServer(503);

    expect(await letGoOfTablet(db, "tab-1", fetchFn)).toBe("kept");

    expect(posted).toHaveLength(1);
    expect((await db.outbox.toArray()).map((e) => [e.id, e.state])).toEqual([[refused.id, "refused"]]);
  });
});
