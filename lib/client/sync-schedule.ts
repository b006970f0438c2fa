/**
 * When the bench syncs: at start, every `everyMs`, when the network comes back, when the tablet's
 * screen is shown again, and when asked (a save, Sync now); never while the browser says it is
 * offline. `run` is the single-flight sync runner (./single-flight.ts), so triggers that arrive
 * during a run never start a second one alongside it; a poll or the screen shown during a run adds
 * nothing. `onBusy` hears whether a run is going.
 * The browser's events come in through `env`, so the schedule is tested without a browser.
 */
export interface SyncScheduleEnv {
  isOnline(): boolean;
  /** Calls `cb` when the network comes back; returns the unsubscribe. */
  onOnline(cb: () => void): () => void;
  /** Calls `cb` when the page is shown again (tab or screen back in view); returns the unsubscribe. */
  onShown(cb: () => void): () => void;
  every(ms: number, cb: () => void): () => void;
}

export interface SyncSchedule {
  /** A run now, if online. */
  now(): void;
  stop(): void;
}

export function syncSchedule(
  run: () => Promise<unknown>,
  opts: { everyMs: number; env: SyncScheduleEnv; onBusy: (busy: boolean) => void },
): SyncSchedule {
  const { env, onBusy } = opts;
  let waiting = 0;
  let stopped = false;
  const now = () => {
    if (stopped || !env.isOnline()) return;
    if (waiting++ === 0) onBusy(true);
    const settle = () => {
      if (--waiting === 0 && !stopped) onBusy(false);
    };
    // a failed run is not an error of the schedule: the outbox keeps the work and the next trigger tries again
    run().then(settle, settle);
  };
  // The poll and the screen coming back are no news: while a run is going they add nothing. A save
  // or Sync now (`now`) and the network's return ask for one more run after the current one.
  const unlessRunning = () => {
    if (waiting === 0) now();
  };
  const unsubscribe = [env.onOnline(now), env.onShown(unlessRunning), env.every(opts.everyMs, unlessRunning)];
  now();
  return {
    now,
    stop() {
      stopped = true;
      for (const u of unsubscribe) u();
    },
  };
}

/** The browser's events for `syncSchedule`. */
export function browserSyncEnv(): SyncScheduleEnv {
  const listen = (target: EventTarget, type: string, cb: () => void) => {
    target.addEventListener(type, cb);
    return () => target.removeEventListener(type, cb);
  };
  return {
    isOnline: () => navigator.onLine,
    onOnline: (cb) => listen(window, "online", cb),
    onShown: (cb) =>
      listen(document, "visibilitychange", () => {
        if (document.visibilityState === "visible") cb();
      }),
    every: (ms, cb) => {
      const t = setInterval(cb, ms);
      return () => clearInterval(t);
    },
  };
}

/** Subscribes to the browser's online and offline events (for React's useSyncExternalStore). */
export function subscribeOnline(onChange: () => void): () => void {
  window.addEventListener("online", onChange);
  window.addEventListener("offline", onChange);
  return () => {
    window.removeEventListener("online", onChange);
    window.removeEventListener("offline", onChange);
  };
}
