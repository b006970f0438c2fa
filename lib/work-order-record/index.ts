/**
 * The record of one work order as people read it — the mechanic at the bench and the office's
 * build progress alike: the server's snapshot with this tablet's work still on its way laid on
 * top, turned into per-step and per-stage state. Pure (no React, no IndexedDB), so the same rules
 * hold online and offline, on the tablet and on the server. Withdrawn entries stay in the record,
 * marked, and no longer count; a step a timer holds is marked `blockedBy` (lib/sync/holds.ts).
 */
import type { Operation } from "@/lib/sync/operations";
import { partsByStep, photosByStep } from "./parts";
import { pendingOnTop } from "./pending";
import { currentReadings } from "@/lib/sync/readings";
import { readingViews, stepReadings } from "./readings";
import { decisionInForce, decisionOn, latestDecisions, standingSignOff } from "./stage-state";
import { stepCompletion } from "./step-state";
import { applyHolds, timerViews } from "./timers";
import { boltRecords, torqueProgress } from "./torque";
import type { Snapshot, StageView, StepView, WorkOrderView } from "./types";
import { withdrawnEntries } from "./withdrawn";

export function buildWorkOrderView(snapshot: Snapshot, pending: readonly Operation[], nowMs: number): WorkOrderView {
  const work = pendingOnTop(snapshot, pending);
  const withdrawn = withdrawnEntries(snapshot, work);
  const readings = readingViews(snapshot, work);
  const current = currentReadings(readings);
  const bolts = boltRecords(snapshot, work, withdrawn);
  const timers = timerViews(snapshot, work, nowMs);
  const photos = photosByStep(snapshot, work, withdrawn);
  const parts = partsByStep(snapshot, work, withdrawn);
  const decisions = latestDecisions(snapshot);

  const steps: StepView[] = [];
  const stages: StageView[] = [];
  let outOfTolerance = 0;
  for (const proc of snapshot.procedures) {
    const procSteps: StepView[] = [];
    const procStages: Array<{ stage: (typeof proc.stages)[number]; steps: StepView[] }> = [];
    for (const stage of proc.stages) {
      const stageSteps: StepView[] = [];
      for (const step of stage.steps) {
        const measured = stepReadings(step, readings, current);
        outOfTolerance += measured.outOfTolerance;
        const missing = [...measured.missing];
        const torque = step.torqueSpecs.map((spec) => torqueProgress(spec, bolts.get(spec.id) ?? []));
        for (const t of torque) if (!t.complete) missing.push(`${t.spec.label}: torque sequence not finished`);
        const stepTimers = timers.filter((t) => t.stepId === step.id);
        for (const spec of step.timerSpecs)
          if (!stepTimers.some((t) => t.timerSpecId === spec.id && !t.cancelled)) missing.push(`Start the timer: ${spec.label}`);
        const stepPhotos = photos.get(step.id) ?? [];
        const photoCount = stepPhotos.filter((p) => !p.withdrawn).length;
        if (step.requiresPhoto && photoCount === 0) missing.push("Take at least one photo");
        stageSteps.push({
          step,
          stageKey: stage.key,
          jobProcedureId: proc.jobProcedureId,
          index: steps.length + procSteps.length + stageSteps.length,
          ...stepCompletion(snapshot, step.id, work, withdrawn),
          readings: measured.readings,
          current: measured.current,
          torque,
          timers: stepTimers,
          blockedBy: null,
          photoCount,
          photos: stepPhotos,
          parts: parts.get(step.id) ?? [],
          missing,
        });
      }
      procSteps.push(...stageSteps);
      procStages.push({ stage, steps: stageSteps });
    }
    applyHolds(procSteps, proc, nowMs);
    for (const { stage, steps: stageSteps } of procStages) {
      const latestDecision = decisionOn(decisions, proc.jobProcedureId, stage.key);
      const signedOff = standingSignOff(snapshot, proc.jobProcedureId, stage.key, latestDecision, work, withdrawn);
      const decision = decisionInForce(latestDecision, signedOff);
      const allDone = stageSteps.every((s) => s.done);
      stages.push({
        jobProcedureId: proc.jobProcedureId,
        procedureName: proc.name,
        key: stage.key,
        title: stage.title,
        steps: stageSteps,
        allDone,
        signedOff,
        decision: decision ? { decision: decision.decision, reason: decision.reason } : null,
        canSignOff: allDone && !signedOff,
      });
    }
    steps.push(...procSteps);
  }
  return { stages, steps, doneCount: steps.filter((s) => s.done).length, totalCount: steps.length, outOfTolerance };
}

export { readingCount } from "./readings";
export { stepWithSerial } from "./parts";
export type * from "./types";
