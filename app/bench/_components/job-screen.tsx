"use client";

import { useState } from "react";
import { recordOperation } from "@/lib/client/bench-store";
import { announceNotSaved } from "@/lib/client/not-saved";
import { formatDayTime } from "@/lib/format/dates";
import { useAuthor, useBench } from "./bench-context";
import { BigButton } from "./big-button";
import { ClockPanel } from "./clock-panel";
import { go } from "./hash-route";
import { useJob } from "./job-data";
import { CopyFreshness } from "./copy-freshness";
import { ProgressBar } from "./progress-bar";
import { WithdrawEntry } from "./withdraw-entry";

/** One job: its stages and steps with what is done, and the sign-off of each finished stage. */
export function JobScreen({ jobId }: { jobId: string }) {
  const { db, user, syncNow } = useBench();
  const author = useAuthor();
  const { data, loading, error } = useJob(jobId);
  const [busy, setBusy] = useState<string | null>(null);
  if (loading) return <p className="p-6 text-xl">Loading the job…</p>;
  if (!data) {
    return (
      <div className="flex flex-col gap-4 p-6">
        <p role="alert" className="text-xl font-bold text-fail">
          {error ?? "Job not found."}
        </p>
        <BigButton tone="plain" onClick={() => go({ screen: "home" })}>
          Back to the bench
        </BigButton>
      </div>
    );
  }
  const { snapshot, view } = data;
  const wo = snapshot.workOrder;

  async function signOff(jobProcedureId: string, stageKey: string) {
    setBusy(`${jobProcedureId}|${stageKey}`);
    try {
      await recordOperation(db, author, jobId, "stage.signed-off", { jobProcedureId, stageKey });
      syncNow();
    } catch (e) {
      announceNotSaved(e);
    } finally {
      setBusy(null);
    }
  }

  const firstOpen = view.steps.find((s) => !s.done);
  return (
    <div className="flex flex-col gap-4 p-4">
      <div className="flex flex-wrap items-start gap-4">
        <BigButton tone="plain" onClick={() => go({ screen: "home" })} aria-label="Back to the bench">
          ← Bench
        </BigButton>
        <div className="flex-1">
          <p className="font-mono text-lg text-steel-700">
            #{wo.number} · tag {snapshot.bike.tagCode} · {wo.statusLabel}
          </p>
          <h1 className="text-3xl font-bold">
            {snapshot.bike.make} {snapshot.bike.model}
          </h1>
          <p className="text-xl">{wo.title}</p>
        </div>
        {firstOpen && (
          <BigButton tone="go" onClick={() => go({ screen: "step", jobId, stepIndex: firstOpen.index })} className="min-h-24 text-2xl">
            Carry on: step {firstOpen.index + 1}
          </BigButton>
        )}
      </div>
      <ClockPanel snapshot={snapshot} pending={data.pending} />
      <ProgressBar done={view.doneCount} total={view.totalCount} />
      <CopyFreshness job={data} />
      {(!wo.mayWork || !wo.openForBenchWork) && (
        <p className="rounded-xl border-4 border-warn bg-warn-light p-3 text-lg font-bold text-warn" data-testid="job-not-yours">
          <span aria-hidden="true">⚑ </span>
          {!wo.openForBenchWork && <>This job is {wo.statusLabel.toLowerCase()}: it is not open for bench work. </>}
          {!wo.mayWork && <>This job is assigned to {wo.assignedMechanic?.name ?? "another mechanic"}. </>}
          You can still record work here: it is kept and flagged for the supervisor to check, with this reason.
        </p>
      )}
      {snapshot.procedures.some((p) => p.exampleOnly) && (
        <p className="rounded-xl border-2 border-steel-700 bg-white p-3 text-base">
          <strong>Example figures.</strong> The procedures on this job carry example values: the engine maker&apos;s service data and the
          parts makers&apos; sheets always win.
        </p>
      )}
      {view.stages.map((stage) => (
        <section
          key={`${stage.jobProcedureId}|${stage.key}`}
          className="rounded-xl border-4 border-steel-300 bg-white p-4"
          aria-label={`Stage ${stage.title}`}
        >
          <p className="text-base text-steel-700">{stage.procedureName}</p>
          <h2 className="text-2xl font-bold">{stage.title}</h2>
          {stage.decision?.decision === "sent_back" && !stage.signedOff && (
            <p className="mt-2 rounded-lg border-4 border-fail bg-fail-light p-3 text-lg font-bold text-fail">
              Sent back by the supervisor: {stage.decision.reason}
            </p>
          )}
          {stage.decision?.decision === "approved" && stage.signedOff && (
            <p className="mt-2 text-lg font-bold text-pass">✔ Approved by the supervisor</p>
          )}
          <ol className="mt-3 grid gap-2 md:grid-cols-2">
            {stage.steps.map((s) => (
              <li key={s.step.id}>
                <button
                  type="button"
                  onClick={() => go({ screen: "step", jobId, stepIndex: s.index })}
                  className={`flex min-h-target w-full items-center gap-3 rounded-lg border-2 px-3 py-2 text-left text-lg ${s.reopened ? "border-fail bg-fail-light" : s.done ? "border-pass bg-pass-light" : "border-steel-700 bg-white"}`}
                >
                  <span aria-hidden="true" className="w-8 text-center text-2xl">
                    {s.reopened ? "↺" : s.done ? "✔" : "○"}
                  </span>
                  <span className="flex-1">
                    <span className="font-bold">
                      {s.index + 1}. {s.step.title}
                    </span>
                    <span className="block text-base">
                      {s.reopened ? "Reopened — redo" : s.done ? (s.donePending ? "Done (waiting to send)" : "Done") : "To do"}
                    </span>
                  </span>
                </button>
              </li>
            ))}
          </ol>
          <div className="mt-3">
            {stage.signedOff ? (
              <div className="flex flex-wrap items-center gap-4">
                <p className="flex-1 text-lg font-bold" data-testid="stage-signed">
                  Signed off {formatDayTime(stage.signedOff.at)}
                  {stage.signedOff.pending ? " (waiting to send)" : ""}
                  {stage.decision === null || stage.decision.decision === "sent_back" ? " — waiting for review" : ""}
                </p>
                <WithdrawEntry
                  jobId={jobId}
                  operationId={stage.signedOff.id}
                  recordedBy={stage.signedOff.by}
                  what="this sign-off"
                  testId="withdraw-sign-off"
                />
              </div>
            ) : (
              <BigButton tone="go" disabled={!stage.canSignOff || busy !== null} onClick={() => signOff(stage.jobProcedureId, stage.key)}>
                {stage.allDone ? `Sign off “${stage.title}” as ${user.name}` : "Sign off when every step is done"}
              </BigButton>
            )}
          </div>
        </section>
      ))}
    </div>
  );
}
