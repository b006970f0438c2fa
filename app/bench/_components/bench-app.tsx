"use client";

import { useEffect, useMemo, useState } from "react";
import { benchDb } from "@/lib/client/bench-db";
import { unsentCount } from "@/lib/client/bench-store";
import { whileBenchOpen } from "@/lib/client/sign-out";
import { deviceId as readDeviceId } from "@/lib/client/device-id";
import { useBayLight } from "./bay-light";
import { BenchContext, type BenchUser } from "./bench-context";
import { useHashRoute } from "./hash-route";
import { HomeScreen } from "./home-screen";
import { JobScreen } from "./job-screen";
import { NotSavedNotice } from "./not-saved-notice";
import { NotStoredScreen } from "./not-stored-screen";
import { ScanScreen } from "./scan-screen";
import { StepScreen } from "./step-screen";
import { SyncBar } from "./sync-bar";
import { TimerAlerts } from "./timer-alerts";
import { useBenchSync } from "./use-bench-sync";
import { useSessionWatch } from "./use-session-watch";

export function BenchApp({ user }: { user: BenchUser }) {
  const db = useMemo(() => benchDb(user.id), [user.id]);
  // Rendered only in the browser (bench-boot.tsx loads this module after the first paint), so the
  // device id kept in localStorage is read at once: the first render is already the live bench.
  const [device] = useState(readDeviceId);
  const { syncing, syncNow } = useBenchSync(db, user.id, device);
  const tabletSession = useSessionWatch(db, user.id, device);
  const author = useMemo(() => ({ userId: user.id, deviceId: device }), [user.id, device]);

  // Ask the browser to keep the bench's store under storage pressure (an evicted store would take
  // work not yet sent with it). The browser decides; the bench works either way.
  useEffect(() => void navigator.storage?.persist?.().catch(() => undefined), []);
  // signing out names the work this tablet still holds for the server
  useEffect(() => whileBenchOpen(() => unsentCount(db)), [db]);

  const route = useHashRoute();
  const [bayLight, toggleBayLight] = useBayLight();
  const value = useMemo(() => ({ user, db, author, syncNow }), [user, db, author, syncNow]);
  return (
    <BenchContext.Provider value={value}>
      <div data-bay={bayLight} data-testid="bench-root" className="flex flex-1 flex-col bg-paper text-ink">
        <SyncBar syncing={syncing} bayLight={bayLight} onToggleBayLight={toggleBayLight} />
        {tabletSession !== "open" && (
          <p
            role="alert"
            data-testid="session-ended"
            className="border-y-4 border-fail bg-fail-light px-6 py-4 text-xl font-bold text-fail"
          >
            ■ The office ended this tablet&apos;s session.{" "}
            {tabletSession === "handing-over"
              ? "Handing the work not yet sent to the office, then clearing this tablet…"
              : "The work not yet sent could not be handed over yet (no network?): it stays here and is tried again."}
          </p>
        )}
        <NotSavedNotice />
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
