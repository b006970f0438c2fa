"use client";

import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import type { BenchDb } from "@/lib/client/bench-db";
import { singleFlight, withBrowserLock } from "@/lib/client/single-flight";
import { syncOnce } from "@/lib/client/sync-client";
import { browserSyncEnv, syncSchedule, type SyncSchedule } from "@/lib/client/sync-schedule";

const SYNC_EVERY_MS = 20_000;

/**
 * The bench's sync: on start, when the network comes back, every 20 s, when the screen is shown
 * again and when asked (a save, Sync now), never while offline (lib/client/sync-schedule.ts).
 * Every trigger goes through one single-flight runner holding a browser lock, so runs never
 * overlap (in this tab or another); a trigger during a run asks for one more run after it.
 */
export function useBenchSync(db: BenchDb, userId: string, deviceId: string | null): { syncing: boolean; syncNow: () => void } {
  const [syncing, setSyncing] = useState(false);
  const schedule = useRef<SyncSchedule | null>(null);
  const runner = useMemo(
    () =>
      deviceId ? singleFlight(() => withBrowserLock(`benchtag-sync-${userId}`, () => syncOnce(db, deviceId, fetch, { userId }))) : null,
    [db, userId, deviceId],
  );
  useEffect(() => {
    if (!runner) return;
    const s = syncSchedule(() => runner.run(), { everyMs: SYNC_EVERY_MS, env: browserSyncEnv(), onBusy: setSyncing });
    schedule.current = s;
    return () => {
      s.stop();
      schedule.current = null;
      setSyncing(false);
    };
  }, [runner]);
  const syncNow = useCallback(() => schedule.current?.now(), []);
  return { syncing, syncNow };
}
