"use client";

import { useCallback, useEffect, useState } from "react";
import type { BenchApp as BenchAppComponent } from "./bench-app";
import type { BenchUser } from "./bench-context";
import { BenchShell } from "./bench-shell";

type Loaded = { App: typeof BenchAppComponent } | "failed" | null;

/**
 * The bench's first load: the server-rendered shell, then the bench itself (IndexedDB, sync,
 * validation, every screen) fetched as its own script right after the first paint. The service
 * worker precaches that script with the page, so it loads offline as well.
 */
export function BenchBoot({ user }: { user: BenchUser }) {
  const [loaded, setLoaded] = useState<Loaded>(null);
  const load = useCallback(() => {
    setLoaded(null);
    import("./bench-app").then(
      (m) => setLoaded({ App: m.BenchApp }),
      () => setLoaded("failed"),
    );
  }, []);
  useEffect(load, [load]);
  if (loaded && loaded !== "failed") return <loaded.App user={user} />;
  return <BenchShell failed={loaded === "failed"} onRetry={load} />;
}
