"use client";

import { useQuery } from "@tanstack/react-query";
import { useCallback, useEffect, useMemo } from "react";
import type { BenchDb } from "@/lib/client/bench-db";
import { followBrowserOnlineState } from "@/lib/client/online-state";
import { singleFlight, withBrowserLock } from "@/lib/client/single-flight";
import { syncOnce } from "@/lib/client/sync-client";

const SYNC_EVERY_MS = 20_000;

/**
 * The bench's sync: on start, when the network comes back, every 20 s, on focus and when asked
 * (a save, Sync now). Every trigger goes through one single-flight runner holding a browser lock,
 * so runs never overlap (in this tab or another); a trigger during a run asks for one more run
 * after it. Paused while offline (react-query's networkMode "online", told the real state).
 */
export function useBenchSync(db: BenchDb, userId: string, deviceId: string | null): { syncing: boolean; syncNow: () => void } {
  useEffect(() => followBrowserOnlineState(), []);
  const runner = useMemo(
    () =>
      deviceId ? singleFlight(() => withBrowserLock(`benchtag-sync-${userId}`, () => syncOnce(db, deviceId, fetch, { userId }))) : null,
    [db, userId, deviceId],
  );
  const sync = useQuery({
    queryKey: ["bench-sync", userId, deviceId],
    queryFn: () => runner!.run(),
    enabled: runner !== null,
    refetchInterval: SYNC_EVERY_MS,
    refetchOnReconnect: "always",
    refetchOnWindowFocus: "always",
    networkMode: "online",
    staleTime: 0,
  });
  const { refetch } = sync;
  // At once when the network returns (joining a run react-query has just started for it).
  useEffect(() => {
    const onOnline = () => void refetch({ cancelRefetch: false });
    window.addEventListener("online", onOnline);
    return () => window.removeEventListener("online", onOnline);
  }, [refetch]);
  const syncNow = useCallback(() => {
    if (navigator.onLine) void refetch();
  }, [refetch]);
  return { syncing: sync.isFetching, syncNow };
}
