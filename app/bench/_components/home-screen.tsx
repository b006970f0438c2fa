"use client";

import { useState } from "react";
import { STATUS_LABELS } from "@/lib/work-orders/status";
import { useBench } from "./bench-context";
import { BigButton } from "./big-button";
import { go } from "./hash-route";
import { ComeBackOffer } from "./come-back-offer";
import { TagKeypad } from "./tag-keypad";
import { lookUpTag } from "./tag-lookup";
import { useLive } from "./use-live";

/** Start of the bench: scan or type a tag, or pick one of the jobs on this tablet. */
export function HomeScreen() {
  const { db } = useBench();
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [comeBackFrom, setComeBackFrom] = useState<{ workOrderId: string; number: number } | null>(null);
  const listed = useLive(() => db.jobList.toArray(), [db], []);
  const stored = useLive(() => db.jobs.toArray(), [db], []);
  const storedIds = new Set(stored.map((s) => s.id));
  const jobs = listed.length
    ? [...listed].sort((a, b) => Number(b.assignedToMe) - Number(a.assignedToMe) || a.number - b.number)
    : stored.map((s) => ({
        id: s.id,
        number: s.snapshot.workOrder.number,
        title: s.snapshot.workOrder.title,
        status: s.snapshot.workOrder.status,
        bike: s.snapshot.bike,
        assignedToMe: s.snapshot.workOrder.assignedToMe,
      }));

  async function open(code: string) {
    setBusy(true);
    setMessage(null);
    setComeBackFrom(null);
    try {
      const r = await lookUpTag(db, code);
      if (r.ok) go({ screen: "job", jobId: r.jobId });
      else {
        setMessage(r.message);
        setComeBackFrom(r.comeBackFrom ?? null);
      }
    } catch (e) {
      setMessage(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="flex flex-col gap-6 p-4">
      <section aria-labelledby="tag-heading" className="flex flex-col gap-4">
        <h1 id="tag-heading" className="text-3xl font-bold">
          Bench
        </h1>
        <BigButton tone="primary" onClick={() => go({ screen: "scan" })} className="min-h-24 text-2xl">
          Scan a bike&apos;s tag
        </BigButton>
        <p className="text-lg font-bold">Or type the tag code:</p>
        <TagKeypad onSubmit={open} busy={busy} />
        {message && (
          <p
            role="alert"
            data-testid="tag-message"
            className="rounded-xl border-4 border-fail bg-fail-light p-4 text-xl font-bold text-fail"
          >
            {message}
          </p>
        )}
        {comeBackFrom && <ComeBackOffer from={comeBackFrom} />}
      </section>
      <section aria-labelledby="jobs-heading">
        <h2 id="jobs-heading" className="text-2xl font-bold">
          Jobs on this tablet
        </h2>
        {jobs.length === 0 && <p className="mt-3 text-lg">None yet. They arrive with the first sync.</p>}
        <ul className="mt-3 grid gap-3 md:grid-cols-2">
          {jobs.map((j) => (
            <li key={j.id}>
              <button
                type="button"
                onClick={() => go({ screen: "job", jobId: j.id })}
                className="flex min-h-24 w-full flex-col items-start rounded-xl border-4 border-steel-700 bg-white px-4 py-3 text-left"
              >
                <span className="font-mono text-lg text-steel-700">
                  #{j.number} · {j.bike.tagCode} · {STATUS_LABELS[j.status]}
                  {j.assignedToMe ? " · yours" : ""}
                  {storedIds.has(j.id) ? " · on tablet" : ""}
                </span>
                <span className="text-xl font-bold">
                  {j.bike.make} {j.bike.model}
                </span>
                <span className="text-lg">{j.title}</span>
              </button>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
