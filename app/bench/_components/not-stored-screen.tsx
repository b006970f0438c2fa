"use client";

import { useState } from "react";
import type { OutboxEntry } from "@/lib/client/bench-db";
import { discardEntry, entriesNeedingAttention, keepEntry, resendEntry } from "@/lib/client/bench-store";
import { describeEntry, visibleText } from "@/lib/sync/describe-entry";
import { useBench } from "./bench-context";
import { BigButton } from "./big-button";
import { go } from "./hash-route";
import { useLive, useOnline } from "./use-live";
import { formatDayTime } from "@/lib/format/dates";

/** Shortest reason for discarding (the server asks the same). */
const MIN_REASON = 3;

const STATE_LOOK: Record<"refused" | "held" | "discarding", { word: string; mark: string; box: string; text: string }> = {
  refused: { word: "Refused", mark: "✖", box: "border-fail bg-fail-light", text: "text-fail" },
  held: { word: "Held on the server", mark: "⏸", box: "border-warn bg-warn-light", text: "text-warn" },
  discarding: { word: "Being discarded", mark: "⌫", box: "border-steel-700 bg-steel-100", text: "text-steel-900" },
};

/**
 * Work the server did not store: each refused entry with what it was (kind, job, step, values)
 * and why, to send again once the cause is fixed or to discard with a reason; entries the server
 * holds until the record they act on arrives; discards waiting for the network. Nothing leaves
 * this list unless the server has stored it or written down why it was discarded.
 */
export function NotStoredScreen() {
  const { db } = useBench();
  const entries = useLive(() => entriesNeedingAttention(db), [db], [] as OutboxEntry[]);
  const jobs = useLive(() => db.jobs.toArray(), [db], []);
  const listed = useLive(() => db.jobList.toArray(), [db], []);
  const copyOf = (id: string) => jobs.find((j) => j.id === id)?.snapshot;
  const numberOf = (id: string) => listed.find((j) => j.id === id)?.number ?? null;
  const groups = (["refused", "held", "discarding"] as const).map((state) => ({ state, list: entries.filter((e) => e.state === state) }));

  return (
    <div className="flex flex-col gap-4 p-4" data-testid="not-stored-screen">
      <div className="flex flex-wrap items-center gap-4">
        <BigButton tone="plain" onClick={() => go({ screen: "home" })} aria-label="Back to the bench">
          ← Bench
        </BigButton>
        <h1 className="flex-1 text-3xl font-bold">Work not stored by the server</h1>
      </div>
      <p className="text-xl">
        Nothing here is lost: each entry stays on this tablet until the server stores it, or you discard it with a reason (the server keeps
        a note of what it was and why).
      </p>
      {entries.length === 0 && (
        <p className="rounded-xl border-4 border-pass bg-pass-light p-4 text-xl font-bold text-pass" role="status">
          <span aria-hidden="true">✔ </span>Every entry on this tablet was stored or is waiting to be sent.
        </p>
      )}
      {groups.map(({ state, list }) =>
        list.length ? (
          <section key={state} aria-label={STATE_LOOK[state].word} className="flex flex-col gap-4">
            <h2 className={`text-2xl font-bold ${STATE_LOOK[state].text}`}>
              <span aria-hidden="true">{STATE_LOOK[state].mark} </span>
              {STATE_LOOK[state].word} ({list.length})
            </h2>
            {state === "held" && (
              <p className="text-lg">
                The server keeps these until the entry they act on arrives (from this tablet or another), then applies them. They are sent
                again with every sync until then.
              </p>
            )}
            {list.map((e) => (
              <EntryCard key={e.id} entry={e} job={copyOf(e.workOrderId)} jobNumber={numberOf(e.workOrderId)} />
            ))}
          </section>
        ) : null,
      )}
    </div>
  );
}

function EntryCard({ entry, job, jobNumber }: { entry: OutboxEntry; job: Parameters<typeof describeEntry>[1]; jobNumber: number | null }) {
  const { db, syncNow } = useBench();
  const online = useOnline();
  const [discarding, setDiscarding] = useState(false);
  const [reason, setReason] = useState("");
  const d = describeEntry(entry.op, job, jobNumber);
  const look = STATE_LOOK[entry.state as keyof typeof STATE_LOOK];
  const ready = reason.trim().length >= MIN_REASON;

  async function resend() {
    await resendEntry(db, entry.id);
    syncNow();
  }
  async function discard() {
    if (!ready) return;
    await discardEntry(db, entry.id, reason.trim());
    setDiscarding(false);
    syncNow();
  }

  return (
    <article className={`flex flex-col gap-3 rounded-xl border-4 p-4 ${look.box}`} data-testid="not-stored-entry" data-state={entry.state}>
      <header className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <span className={`text-lg font-bold ${look.text}`}>
          <span aria-hidden="true">{look.mark} </span>
          {look.word}
        </span>
        <h3 className="text-2xl font-bold">{d.what}</h3>
        {d.job && <span className="font-mono text-lg">{d.job}</span>}
      </header>
      {d.step && <p className="text-xl">{d.step}</p>}
      {d.details.length > 0 && (
        <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-xl" data-testid="entry-values">
          {d.details.map((x) => (
            <div key={x.label} className="contents">
              <dt className="font-bold">{x.label}</dt>
              <dd className="break-words font-mono">{x.value}</dd>
            </div>
          ))}
        </dl>
      )}
      {d.recordedAt && <p className="text-lg text-steel-700">Recorded on this tablet {formatDayTime(d.recordedAt)}</p>}
      <p className="rounded-lg border-2 border-steel-700 bg-white p-3 text-xl" data-testid="entry-reason">
        <strong>{entry.state === "held" ? "Why it waits: " : "Why: "}</strong>
        {visibleText(entry.reason ?? "")}
      </p>
      {entry.state === "discarding" ? (
        <div className="flex flex-wrap items-center gap-4">
          <p className="flex-1 text-xl">
            <strong>Your reason:</strong> {entry.discardReason}. {online ? "Sending…" : "Waits for the network."}
          </p>
          <BigButton tone="plain" onClick={() => void keepEntry(db, entry.id)}>
            Keep it after all
          </BigButton>
        </div>
      ) : discarding ? (
        <div className="flex flex-col gap-3">
          <label className="flex flex-col gap-2 text-xl font-bold">
            Why discard it? (the server keeps a note)
            <textarea
              value={reason}
              onChange={(e) => setReason(e.target.value)}
              rows={2}
              maxLength={500}
              className="min-h-target rounded-lg border-2 border-steel-700 bg-white p-3 text-xl font-normal"
            />
          </label>
          <div className="flex flex-wrap gap-4">
            <BigButton tone="danger" onClick={discard} disabled={!ready}>
              Discard with this reason
            </BigButton>
            <BigButton tone="plain" onClick={() => setDiscarding(false)}>
              Keep it
            </BigButton>
          </div>
          {!ready && <p className="text-lg">Say in a few words why it goes (at least {MIN_REASON} characters).</p>}
        </div>
      ) : (
        <div className="flex flex-wrap gap-4">
          {entry.state === "refused" && (
            <BigButton tone="go" onClick={resend}>
              Send again
            </BigButton>
          )}
          <BigButton tone="plain" onClick={() => setDiscarding(true)}>
            Discard…
          </BigButton>
        </div>
      )}
    </article>
  );
}
