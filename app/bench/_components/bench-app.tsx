"use client";

import { QueryClient, QueryClientProvider, useQuery } from "@tanstack/react-query";
import { useCallback, useEffect, useMemo, useState } from "react";
import { benchDb } from "@/lib/client/bench-db";
import { deviceId as readDeviceId } from "@/lib/client/device-id";
import { syncOnce } from "@/lib/client/sync-client";
import { useBayLight } from "./bay-light";
import { BenchContext, type BenchUser } from "./bench-context";
import { useHashRoute } from "./hash-route";
import { HomeScreen } from "./home-screen";
import { JobScreen } from "./job-screen";
import { ScanScreen } from "./scan-screen";
import { StepScreen } from "./step-screen";
import { SyncBar } from "./sync-bar";
import { TimerAlerts } from "./timer-alerts";

export function BenchApp({ user }: { user: BenchUser }) {
  const [client] = useState(() => new QueryClient({ defaultOptions: { queries: { retry: false } } }));
  return (
    <QueryClientProvider client={client}>
      <BenchRoot user={user} />
    </QueryClientProvider>
  );
}

const SYNC_EVERY_MS = 20_000;

function BenchRoot({ user }: { user: BenchUser }) {
  const db = useMemo(() => benchDb(user.id), [user.id]);
  const [device, setDevice] = useState<string | null>(null);
  useEffect(() => {
    setDevice(readDeviceId());
  }, []);

  // Push and pull on start, on the browser's `online` event (react-query refetches on reconnect),
  // on an interval, and when asked. Paused while offline (networkMode "online").
  const sync = useQuery({
    queryKey: ["bench-sync", user.id, device],
    queryFn: () => syncOnce(db, device!),
    enabled: device !== null,
    refetchInterval: SYNC_EVERY_MS,
    refetchOnReconnect: "always",
    refetchOnWindowFocus: "always",
    networkMode: "online",
    staleTime: 0,
  });
  const { refetch } = sync;
  const syncNow = useCallback(() => {
    if (navigator.onLine) void refetch();
  }, [refetch]);

  const route = useHashRoute();
  const [bayLight, toggleBayLight] = useBayLight();
  if (!device) return <p className="p-6 text-xl">Opening the bench…</p>;
  return (
    <BenchContext.Provider value={{ user, db, deviceId: device, syncNow }}>
      <div data-bay={bayLight} data-testid="bench-root" className="flex flex-1 flex-col bg-paper text-ink">
        <SyncBar syncing={sync.isFetching} bayLight={bayLight} onToggleBayLight={toggleBayLight} />
        <TimerAlerts />
        <div className="flex-1">
          {route.screen === "home" && <HomeScreen />}
          {route.screen === "scan" && <ScanScreen />}
          {route.screen === "job" && <JobScreen jobId={route.jobId} />}
          {route.screen === "step" && <StepScreen jobId={route.jobId} stepIndex={route.stepIndex} />}
        </div>
      </div>
    </BenchContext.Provider>
  );
}
