"use client";

import { useState } from "react";
import { useBench } from "./bench-context";
import { currentScreen, go, goFrom } from "./hash-route";
import { ComeBackOffer } from "./come-back-offer";
import { HomeView, type HomeJob } from "./home-view";
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
  const jobs: HomeJob[] = listed.length
    ? [...listed]
        .sort((a, b) => Number(b.assignedToMe) - Number(a.assignedToMe) || a.number - b.number)
        .map((j) => ({ ...j, onTablet: storedIds.has(j.id) }))
    : stored.map((s) => ({
        id: s.id,
        number: s.snapshot.workOrder.number,
        title: s.snapshot.workOrder.title,
        status: s.snapshot.workOrder.status,
        bike: s.snapshot.bike,
        assignedToMe: s.snapshot.workOrder.assignedToMe,
        onTablet: true,
      }));

  async function open(code: string) {
    setBusy(true);
    setMessage(null);
    setComeBackFrom(null);
    const from = currentScreen();
    try {
      const r = await lookUpTag(db, code);
      if (r.ok) goFrom(from, { screen: "job", jobId: r.jobId });
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
    <HomeView
      jobs={jobs}
      busy={busy}
      onScan={() => go({ screen: "scan" })}
      onOpenTag={open}
      onOpenJob={(jobId) => go({ screen: "job", jobId })}
      notice={
        <>
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
        </>
      }
    />
  );
}
