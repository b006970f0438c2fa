/**
 * One run at a time. `run()` while idle starts the task; while a run is going it asks for one
 * more run right after it (however many ask, one more), and resolves with that run's result —
 * never a second run alongside the first. Used for the sync, whatever starts it (a save, the
 * timer, the network coming back, the Sync now button).
 */
export interface SingleFlight<T> {
  run(): Promise<T>;
  readonly running: boolean;
}

export function singleFlight<T>(task: () => Promise<T>): SingleFlight<T> {
  let current: Promise<T> | null = null;
  let queued: { promise: Promise<T>; resolve: (v: T) => void; reject: (e: unknown) => void } | null = null;

  function launch(): Promise<T> {
    const p = Promise.resolve().then(task);
    current = p;
    const settle = () => {
      current = null;
      const q = queued;
      queued = null;
      if (q) launch().then(q.resolve, q.reject);
    };
    p.then(settle, settle);
    return p;
  }

  return {
    run() {
      if (!current) return launch();
      if (!queued) {
        let resolve!: (v: T) => void;
        let reject!: (e: unknown) => void;
        const promise = new Promise<T>((res, rej) => {
          resolve = res;
          reject = rej;
        });
        queued = { promise, resolve, reject };
      }
      return queued.promise;
    },
    get running() {
      return current !== null;
    },
  };
}

/**
 * Runs `task` holding the browser's named lock (Web Locks), so two tabs of the same user on one
 * tablet never sync at once either; without Web Locks, just runs it.
 */
export function withBrowserLock<T>(name: string, task: () => Promise<T>): Promise<T> {
  const locks = typeof navigator !== "undefined" ? navigator.locks : undefined;
  if (!locks) return task();
  return locks.request(name, () => task()) as Promise<T>;
}
