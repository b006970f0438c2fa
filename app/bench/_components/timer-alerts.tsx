"use client";

import { useEffect, useRef, useState } from "react";
import { dueAlerts } from "@/lib/bench/timer-alerts";
import { useBench } from "./bench-context";
import { useLive, useNow } from "./use-live";

interface RunningTimer {
  id: string;
  label: string;
  endsAtMs: number;
  jobNumber: number | null;
}

const SEEN_KEY = "benchtag-timers-acknowledged";

function beep() {
  try {
    const ctx = new AudioContext();
    for (let i = 0; i < 3; i++) {
      const osc = ctx.createOscillator();
      const gain = ctx.createGain();
      osc.frequency.value = 880;
      gain.gain.value = 0.3;
      osc.connect(gain).connect(ctx.destination);
      osc.start(ctx.currentTime + i * 0.4);
      osc.stop(ctx.currentTime + i * 0.4 + 0.25);
    }
  } catch {
    // no audio on this device: the banner still shows
  }
}

/** A banner and a sound when any timer on this tablet runs out, whichever screen is open. */
export function TimerAlerts() {
  const { db } = useBench();
  const now = useNow(1000);
  const timers = useLive<RunningTimer[]>(
    async () => {
      const jobs = await db.jobs.toArray();
      const out: RunningTimer[] = [];
      const numberOf = new Map(jobs.map((j) => [j.id, j.snapshot.workOrder.number]));
      for (const j of jobs)
        for (const t of j.snapshot.state.timers)
          if (!t.stoppedAt && !t.overrideReason && !t.cancelledAt)
            out.push({
              id: t.id,
              label: t.label,
              endsAtMs: Date.parse(t.startedAt) + t.durationS * 1000,
              jobNumber: j.snapshot.workOrder.number,
            });
      const outbox = (await db.outbox.toArray()).filter((o) => o.state !== "refused");
      // overridden, stopped or cancelled on this tablet: no alarm
      const ended = new Set(
        outbox.flatMap((o) =>
          o.op.kind === "timer.overridden" || o.op.kind === "timer.stopped" || o.op.kind === "timer.cancelled"
            ? [o.op.payload.timerId]
            : [],
        ),
      );
      const onRecord = new Set(jobs.flatMap((j) => j.snapshot.state.timers.map((t) => t.id)));
      for (const o of outbox) {
        // a timer sent and already in the job's copy is listed once
        if (o.op.kind === "timer.started" && !onRecord.has(o.op.payload.timerId))
          out.push({
            id: o.op.payload.timerId,
            label: o.op.payload.label,
            endsAtMs: Date.parse(o.op.payload.startedAt) + o.op.payload.durationS * 1000,
            jobNumber: numberOf.get(o.workOrderId) ?? null,
          });
      }
      return out.filter((t) => !ended.has(t.id));
    },
    [db],
    [],
  );
  const [acknowledged, setAcknowledged] = useState<string[]>([]);
  useEffect(() => {
    setAcknowledged(JSON.parse(localStorage.getItem(SEEN_KEY) ?? "[]") as string[]);
  }, []);
  const due = dueAlerts(timers, now, new Set(acknowledged));
  const sounded = useRef(new Set<string>());
  useEffect(() => {
    const fresh = due.filter((t) => !sounded.current.has(t.id));
    if (fresh.length) {
      fresh.forEach((t) => sounded.current.add(t.id));
      beep();
    }
  }, [due]);
  if (!due.length) return null;
  return (
    <div
      role="alert"
      data-testid="timer-alert"
      className="no-print sticky top-0 z-40 flex flex-wrap items-center gap-4 border-b-4 border-ink bg-signal px-4 py-3 text-xl font-bold text-ink"
    >
      <span className="flex-1">Timer done: {due.map((t) => `${t.label}${t.jobNumber ? ` (job #${t.jobNumber})` : ""}`).join("; ")}</span>
      <button
        type="button"
        className="min-h-target rounded-xl border-4 border-ink bg-white px-6"
        onClick={() => {
          const next = [...acknowledged, ...due.map((t) => t.id)].slice(-200);
          localStorage.setItem(SEEN_KEY, JSON.stringify(next));
          setAcknowledged(next);
        }}
      >
        OK
      </button>
    </div>
  );
}
