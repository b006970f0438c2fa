"use client";

import { useEffect, useState } from "react";

// Registers the service worker (used by the bench's layout only) and tells the user when a new
// version is waiting.
// The new version takes over only when the user asks (then the page reloads once).
export function ServiceWorkerStatus() {
  const [waiting, setWaiting] = useState<ServiceWorker | null>(null);

  useEffect(() => {
    if (!("serviceWorker" in navigator) || process.env.NODE_ENV !== "production") return;
    navigator.serviceWorker
      .register("/sw.js", { scope: "/" })
      .then((reg) => {
        if (reg.waiting && navigator.serviceWorker.controller) setWaiting(reg.waiting);
        reg.addEventListener("updatefound", () => {
          const next = reg.installing;
          next?.addEventListener("statechange", () => {
            if (next.state === "installed" && navigator.serviceWorker.controller) setWaiting(next);
          });
        });
      })
      .catch(() => undefined);
  }, []);

  if (!waiting) return null;
  return (
    <div
      role="status"
      className="no-print fixed inset-x-0 bottom-0 z-50 flex items-center gap-4 bg-signal px-4 py-3 text-lg font-bold text-ink"
    >
      A new version of Benchtag is ready.
      <button
        type="button"
        className="min-h-target rounded-lg bg-ink px-5 text-white"
        onClick={() => {
          navigator.serviceWorker.addEventListener("controllerchange", () => window.location.reload(), { once: true });
          waiting.postMessage({ type: "SKIP_WAITING" });
        }}
      >
        Reload now
      </button>
    </div>
  );
}
