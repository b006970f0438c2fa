/**
 * When the office ends this tablet's session (or turns its user off), the tablet lets go of that
 * user's data: the worker's kept pages first, then — once the unsent work is safely with the
 * server — the whole IndexedDB store (job copies, photos, outbox).
 *
 * Unsent work cannot go through the sync any more (nobody is signed in to stand behind it), so it
 * is **handed over**: `POST /api/bench/outbox-handover` keeps every entry the server has not taken —
 * waiting, refused (with the server's reason) and being discarded — as they are, for
 * the office (Sign-ins page, downloadable), and records it in the audit log. Only after the
 * server has answered 201 is the store deleted; if the hand-over fails (network down), nothing is
 * deleted and it is tried again at the next check. Photo bytes not yet uploaded are not sent
 * (their list is): they go with the store.
 */
import { SESSION_STATE_HEADER } from "@/lib/auth/session-lifetime";
import type { BenchDb } from "./bench-db";
import { dropBenchStore, UNTAKEN_STATES } from "./bench-store";
import { clearUserCaches } from "./worker-caches";

export type SessionCheck = "open" | "ended" | "signed-out" | "someone-else" | "unknown";

/**
 * Asks the server whether this tablet's session still stands; with `userId` (the bench's user),
 * "someone-else" when the browser is now signed in as another person (in another tab).
 */
export async function checkSession(fetchFn: typeof fetch = fetch, userId?: string): Promise<SessionCheck> {
  try {
    const res = await fetchFn("/api/me", { cache: "no-store", signal: AbortSignal.timeout(20_000) });
    if (res.ok) {
      if (!userId) return "open";
      const me = (await res.json().catch(() => null)) as { id?: unknown } | null;
      return me && me.id !== userId ? "someone-else" : "open";
    }
    if (res.status === 401) return res.headers.get(SESSION_STATE_HEADER) === "ended" ? "ended" : "signed-out";
    return "unknown";
  } catch {
    return "unknown"; // offline: nothing to decide
  }
}

/** Names this tablet to the server, so the office can end its sessions (best effort). */
export async function nameThisTablet(deviceId: string, fetchFn: typeof fetch = fetch): Promise<void> {
  await fetchFn("/api/me/device", {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ deviceId }),
  }).catch(() => undefined);
}

/** Rounds of hand-over in one go: work recorded while one is on its way goes in the next. */
const MAX_HANDOVER_ROUNDS = 5;

/**
 * Hands over the unsent work, then clears the store. "cleared", or "kept" when the hand-over did
 * not go through. The screens stay usable under the "handing over" banner, so work recorded while
 * a hand-over is on its way is handed over in a further round before anything is deleted: the
 * store is read again after each answer, and only what was not handed yet is sent.
 */
export async function letGoOfTablet(db: BenchDb, deviceId: string, fetchFn: typeof fetch = fetch): Promise<"cleared" | "kept"> {
  await clearUserCaches().catch(() => undefined);
  const handed = new Set<string>();
  for (let round = 0; ; round++) {
    // Sent and held entries are with the server already; everything else is only here.
    const entries = (await db.outbox.where("state").anyOf(UNTAKEN_STATES).sortBy("stamp")).filter((e) => !handed.has(`entry:${e.id}`));
    const photos = (await db.photos.where("uploaded").equals(0).toArray()).filter((p) => !handed.has(`photo:${p.id}`));
    if (!entries.length && !photos.length) break;
    if (round >= MAX_HANDOVER_ROUNDS) return "kept";
    const res = await fetchFn("/api/bench/outbox-handover", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({
        deviceId,
        entries: entries.map((e) => ({
          id: e.id,
          workOrderId: e.workOrderId,
          stamp: e.stamp,
          createdAt: e.createdAt,
          op: e.op,
          state: e.state,
          ...(e.reason ? { reason: e.reason } : {}),
          ...(e.discardReason ? { discardReason: e.discardReason } : {}),
        })),
        photosLeft: photos.map((p) => ({
          id: p.id,
          workOrderId: p.workOrderId,
          stepId: p.stepId,
          byteSize: p.byteSize,
          caption: p.caption.slice(0, 400),
        })),
      }),
      signal: AbortSignal.timeout(60_000),
    }).catch(() => null);
    if (!res || res.status !== 201) return "kept";
    for (const e of entries) handed.add(`entry:${e.id}`);
    for (const p of photos) handed.add(`photo:${p.id}`);
  }
  await dropBenchStore(db);
  return "cleared";
}
