"use client";

import { useEffect, useState } from "react";
import { readSyncMeta } from "@/lib/client/sync-client";
import type { BayLight } from "./bay-light";
import { useBench } from "./bench-context";
import { useLive, useNow } from "./use-live";

function ago(ms: number | null, now: number): string {
  if (!ms) return "never";
  const s = Math.max(0, Math.round((now - ms) / 1000));
  if (s < 60) return `${s} s ago`;
  if (s < 3600) return `${Math.round(s / 60)} min ago`;
  return new Date(ms).toLocaleString();
}

/** Sync state for a glance across the bench: online or not, how much is waiting, last sync, problems. */
export function SyncBar({ syncing, bayLight, onToggleBayLight }: { syncing: boolean; bayLight: BayLight; onToggleBayLight: () => void }) {
  const { db, syncNow } = useBench();
  const now = useNow(5000);
  const [online, setOnline] = useState(true);
  useEffect(() => {
    const update = () => setOnline(navigator.onLine);
    update();
    window.addEventListener("online", update);
    window.addEventListener("offline", update);
    return () => {
      window.removeEventListener("online", update);
      window.removeEventListener("offline", update);
    };
  }, []);
  const waiting = useLive(() => db.outbox.where("state").equals("waiting").count(), [db], 0);
  const refused = useLive(() => db.outbox.where("state").equals("refused").toArray(), [db], []);
  const meta = useLive(() => readSyncMeta(db), [db], { cursor: null, lastSyncedAt: null, lastAttemptAt: null, lastError: null });

  return (
    <section aria-label="Sync" className="no-print border-b-4 border-steel-900 bg-steel-100 px-4 py-2">
      <div className="flex flex-wrap items-center gap-x-6 gap-y-2 text-lg">
        <span data-testid="net-state" className={`flex items-center gap-2 font-bold ${online ? "text-pass" : "text-fail"}`}>
          <span aria-hidden="true">{online ? "●" : "○"}</span>
          {online ? "Online" : "Offline — working on this tablet"}
        </span>
        <span data-testid="waiting-count" className="font-bold">
          {waiting === 0 ? "Nothing waiting to send" : `${waiting} waiting to send`}
        </span>
        <span className="text-steel-700">Last synced {ago(meta.lastSyncedAt, now)}</span>
        {syncing && <span className="font-bold">Syncing…</span>}
        <button
          type="button"
          onClick={onToggleBayLight}
          aria-pressed={bayLight === "dim"}
          className="ml-auto min-h-12 rounded-lg border-2 border-steel-900 bg-white px-4 font-bold"
        >
          <span aria-hidden="true">{bayLight === "dim" ? "☾ " : "☀ "}</span>
          Dim bay
        </button>
        <button
          type="button"
          onClick={syncNow}
          disabled={!online || syncing}
          className="min-h-12 rounded-lg border-2 border-steel-900 bg-white px-4 font-bold disabled:opacity-50"
        >
          Sync now
        </button>
      </div>
      {meta.lastError && online && (
        <p role="status" className="mt-1 font-bold text-fail">
          Last sync failed: {meta.lastError}
        </p>
      )}
      {refused.length > 0 && (
        <details className="mt-2 rounded-lg border-2 border-fail bg-fail-light p-2" data-testid="refused-list">
          <summary className="cursor-pointer text-lg font-bold text-fail">
            {refused.length} entr{refused.length === 1 ? "y" : "ies"} refused by the server — tap to see why
          </summary>
          <ul className="mt-2 space-y-1">
            {refused.map((r) => (
              <li key={r.id}>
                <span className="font-mono">{r.op.kind}</span>: {r.reason}
              </li>
            ))}
          </ul>
        </details>
      )}
    </section>
  );
}
