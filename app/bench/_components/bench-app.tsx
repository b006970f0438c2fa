"use client";

import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useEffect, useMemo, useState } from "react";
import { benchDb } from "@/lib/client/bench-db";
import { deviceId as readDeviceId } from "@/lib/client/device-id";
import { useBayLight } from "./bay-light";
import { BenchContext, type BenchUser } from "./bench-context";
import { useHashRoute } from "./hash-route";
import { HomeScreen } from "./home-screen";
import { JobScreen } from "./job-screen";
import { NotStoredScreen } from "./not-stored-screen";
import { ScanScreen } from "./scan-screen";
import { StepScreen } from "./step-screen";
import { SyncBar } from "./sync-bar";
import { TimerAlerts } from "./timer-alerts";
import { useBenchSync } from "./use-bench-sync";

export function BenchApp({ user }: { user: BenchUser }) {
  const [client] = useState(() => new QueryClient({ defaultOptions: { queries: { retry: false } } }));
  return (
    <QueryClientProvider client={client}>
      <BenchRoot user={user} />
    </QueryClientProvider>
  );
}

function BenchRoot({ user }: { user: BenchUser }) {
  const db = useMemo(() => benchDb(user.id), [user.id]);
  const [device, setDevice] = useState<string | null>(null);
  useEffect(() => {
    setDevice(readDeviceId());
  }, []);
  const { syncing, syncNow } = useBenchSync(db, user.id, device);
  const author = useMemo(() => (device ? { userId: user.id, deviceId: device } : null), [user.id, device]);

  const route = useHashRoute();
  const [bayLight, toggleBayLight] = useBayLight();
  const value = useMemo(() => (author ? { user, db, author, syncNow } : null), [user, db, author, syncNow]);
  if (!value) return <p className="p-6 text-xl">Opening the bench…</p>;
  return (
    <BenchContext.Provider value={value}>
      <div data-bay={bayLight} data-testid="bench-root" className="flex flex-1 flex-col bg-paper text-ink">
        <SyncBar syncing={syncing} bayLight={bayLight} onToggleBayLight={toggleBayLight} />
        <TimerAlerts />
        <div className="flex-1">
          {route.screen === "home" && <HomeScreen />}
          {route.screen === "scan" && <ScanScreen />}
          {route.screen === "not-stored" && <NotStoredScreen />}
          {route.screen === "job" && <JobScreen jobId={route.jobId} />}
          {route.screen === "step" && <StepScreen jobId={route.jobId} stepIndex={route.stepIndex} />}
        </div>
      </div>
    </BenchContext.Provider>
  );
}
