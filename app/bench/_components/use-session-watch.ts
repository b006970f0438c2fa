"use client";

import { useEffect, useState } from "react";
import type { BenchDb } from "@/lib/client/bench-db";
import { checkSession, letGoOfTablet, nameThisTablet } from "@/lib/client/session-end";
import { withBrowserLock } from "@/lib/client/single-flight";

const CHECK_EVERY_MS = 30_000;

export type TabletSession = "open" | "handing-over" | "hand-over-failed";

/**
 * The bench's watch on its session (lib/client/session-end.ts): names the tablet to the server,
 * then checks every 30 s, on focus and when the network returns. When the office has ended the
 * session, hands the unsent work over and clears the store — under the sync's own browser lock, so
 * no sync run is half-way through — then goes to the sign-in page.
 */
export function useSessionWatch(db: BenchDb, userId: string, deviceId: string | null): TabletSession {
  const [state, setState] = useState<TabletSession>("open");
  useEffect(() => {
    if (!deviceId) return;
    let stopped = false;
    let busy = false;
    void nameThisTablet(deviceId);
    const check = async () => {
      if (busy || stopped) return;
      busy = true;
      try {
        const session = await checkSession(fetch, userId);
        // another person signed in in another tab: this page belongs to the last one; the reload
        // opens the bench of whoever is signed in now (this user's store stays as it is)
        if (session === "someone-else") return window.location.reload();
        if (session !== "ended") return;
        setState("handing-over");
        const done = await withBrowserLock(`benchtag-sync-${userId}`, () => letGoOfTablet(db, deviceId));
        if (done === "cleared") window.location.assign("/signin?ended=1");
        else setState("hand-over-failed");
      } finally {
        busy = false;
      }
    };
    void check();
    const timer = window.setInterval(check, CHECK_EVERY_MS);
    window.addEventListener("focus", check);
    window.addEventListener("online", check);
    return () => {
      stopped = true;
      window.clearInterval(timer);
      window.removeEventListener("focus", check);
      window.removeEventListener("online", check);
    };
  }, [db, userId, deviceId]);
  return state;
}
