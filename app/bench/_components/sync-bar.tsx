"use client";

import { readSyncMeta } from "@/lib/client/bench-db";
import { olderCopies } from "@/lib/client/bench-store";
import type { BayLight } from "./bay-light";
import { useBench } from "./bench-context";
import { go } from "./hash-route";
import { useLive, useNow, useOnline } from "./use-live";
import { formatDayTime } from "@/lib/format/dates";

function ago(ms: number | null, now: number): string {
  if (!ms) return "never";
  const s = Math.max(0, Math.round((now - ms) / 1000));
  if (s < 60) return `${s} s ago`;
  if (s < 3600) return `${Math.round(s / 60)} min ago`;
  return formatDayTime(ms);
}

/** Sync state for a glance across the bench: online or not, how much is waiting, last sync, problems. */
export function SyncBar({ syncing, bayLight, onToggleBayLight }: { syncing: boolean; bayLight: BayLight; onToggleBayLight: () => void }) {
  const { db, syncNow } = useBench();
  const now = useNow(5000);
  const online = useOnline();
  const waiting = useLive(() => db.outbox.where("state").equals("waiting").count(), [db], 0);
  const refused = useLive(() => db.outbox.where("state").anyOf("refused", "discarding").count(), [db], 0);
  const held = useLive(() => db.outbox.where("state").equals("held").count(), [db], 0);
  const older = useLive(() => olderCopies(db).then((w) => w.filter((x) => x.missedAt !== undefined).length), [db], 0);
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
        {(refused > 0 || held > 0) && (
          <button
            type="button"
            data-testid="not-stored-count"
            onClick={() => go({ screen: "not-stored" })}
            className={`min-h-target rounded-lg border-4 px-4 text-lg font-bold ${refused > 0 ? "border-fail bg-fail-light text-fail" : "border-warn bg-warn-light text-warn"}`}
          >
            <span aria-hidden="true">{refused > 0 ? "✖ " : "⏸ "}</span>
            {[refused > 0 && `${refused} not stored`, held > 0 && `${held} held on the server`].filter(Boolean).join(" · ")} — see them
          </button>
        )}
        {older > 0 && (
          <span data-testid="older-copies" className="font-bold text-warn">
            <span aria-hidden="true">⟳ </span>
            {older === 1 ? "1 job copy older than the last sync" : `${older} job copies older than the last sync`}
          </span>
        )}
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
    </section>
  );
}
