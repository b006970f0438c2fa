"use client";

import { useState } from "react";
import type { StepView } from "@/lib/work-order-record";
import { recordOperation } from "@/lib/client/bench-store";
import { useAuthor, useBench } from "./bench-context";
import { BigButton } from "./big-button";

/** For a supervisor at the bench: let a step go ahead before its wait is over, with the reason on record. */
export function TimerOverride({ jobId, blocked }: { jobId: string; blocked: NonNullable<StepView["blockedBy"]> }) {
  const { db, user, syncNow } = useBench();
  const author = useAuthor();
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  if (user.role !== "supervisor") return null;

  async function override() {
    const text = reason.trim();
    if (text.length < 3) {
      setError("Give the reason in a few words.");
      return;
    }
    let timerId = blocked.timerId;
    if (!timerId) {
      // Never started: start it now so the override has a timer to stand on.
      timerId = crypto.randomUUID();
      await recordOperation(db, author, jobId, "timer.started", {
        timerId,
        stepId: blocked.stepId,
        timerSpecId: blocked.timerSpecId,
        label: blocked.label,
        durationS: blocked.durationS,
        startedAt: new Date().toISOString(),
      });
    }
    await recordOperation(db, author, jobId, "timer.overridden", { timerId, reason: text });
    syncNow();
  }

  return (
    <div className="mb-3 flex flex-col gap-2 rounded-xl border-4 border-warn bg-warn-light p-3">
      <label className="flex flex-col gap-1 text-lg font-bold">
        Supervisor: reason to go ahead without waiting
        <input
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          className="min-h-target rounded-lg border-2 border-steel-700 bg-white px-3 text-lg font-normal"
        />
      </label>
      {error && <p className="font-bold text-fail">{error}</p>}
      <BigButton tone="danger" records onClick={override}>
        Override the wait
      </BigButton>
    </div>
  );
}
