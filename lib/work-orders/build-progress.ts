/**
 * Where a build stands, stage by stage, for the office: how many steps are done, whether the stage
 * is signed off and what the supervisor decided, and how many current readings are out of
 * tolerance. Worked out from the same job view the bench shows (lib/bench/job-view.ts), so the
 * office and the tablet never disagree. Pure.
 *
 * Our choice: the office still moves the work order between states; this only says when a move is
 * due (every stage approved, or stages waiting for the supervisor while the job is "in build").
 */
import type { WorkOrderStatus } from "./status";

export type StageProgressState = "not_started" | "in_progress" | "ready_to_sign" | "waiting_review" | "sent_back" | "approved";

export const STAGE_PROGRESS_LABELS: Record<StageProgressState, string> = {
  not_started: "Not started",
  in_progress: "In progress",
  ready_to_sign: "Steps done, not signed off",
  waiting_review: "Signed off, waiting for review",
  sent_back: "Sent back to the bench",
  approved: "Approved",
};

/** The parts of a bench stage view this needs (see StageView in lib/bench/job-view.ts). */
export interface StageLike {
  procedureName: string;
  key: string;
  title: string;
  allDone: boolean;
  signedOff: { at: string } | null;
  decision: { decision: "approved" | "sent_back"; reason: string } | null;
  steps: ReadonlyArray<{ done: boolean; current: ReadonlyMap<string, ReadonlyMap<number, { verdict: string }>> }>;
}

interface StageProgress {
  procedureName: string;
  key: string;
  title: string;
  stepsDone: number;
  stepsTotal: number;
  state: StageProgressState;
  /** The supervisor's reason when the stage was sent back. */
  reason: string | null;
  signedOffAt: string | null;
  outOfTolerance: number;
}

export interface BuildProgress {
  stages: StageProgress[];
  stepsDone: number;
  stepsTotal: number;
  outOfTolerance: number;
  approvedStages: number;
  /** What the office should do with the work order's state now, or null. */
  due: { to: WorkOrderStatus; why: string } | null;
}

export function stageState(stage: StageLike): StageProgressState {
  if (stage.signedOff) return stage.decision?.decision === "approved" ? "approved" : "waiting_review";
  if (stage.decision?.decision === "sent_back") return "sent_back";
  if (stage.allDone) return "ready_to_sign";
  return stage.steps.some((s) => s.done) ? "in_progress" : "not_started";
}

export function buildProgress(stages: readonly StageLike[], status: WorkOrderStatus): BuildProgress {
  const out: StageProgress[] = stages.map((stage) => {
    const state = stageState(stage);
    let outOfTolerance = 0;
    for (const step of stage.steps)
      for (const spots of step.current.values()) for (const r of spots.values()) if (r.verdict !== "in") outOfTolerance++;
    return {
      procedureName: stage.procedureName,
      key: stage.key,
      title: stage.title,
      stepsDone: stage.steps.filter((s) => s.done).length,
      stepsTotal: stage.steps.length,
      state,
      reason: state === "sent_back" ? (stage.decision?.reason ?? null) : null,
      signedOffAt: stage.signedOff?.at ?? null,
      outOfTolerance,
    };
  });
  const approvedStages = out.filter((s) => s.state === "approved").length;
  const allApproved = out.length > 0 && approvedStages === out.length;
  let due: BuildProgress["due"] = null;
  if (status === "in_build" && allApproved) {
    due = { to: "in_review", why: "Every stage is approved by the supervisor: the build is through review." };
  } else if (status === "in_build" && out.some((s) => s.state === "waiting_review")) {
    due = { to: "in_review", why: "Signed-off stages are waiting for the supervisor." };
  } else if (status === "in_review" && allApproved) {
    due = {
      to: "on_dyno",
      why: "Every stage is approved by the supervisor: the engine can go on the dyno (or to ready when no dyno work is booked).",
    };
  } else if (status === "in_review" && out.some((s) => s.state === "sent_back")) {
    due = { to: "in_build", why: "The supervisor sent work back to the bench." };
  }
  return {
    stages: out,
    stepsDone: out.reduce((n, s) => n + s.stepsDone, 0),
    stepsTotal: out.reduce((n, s) => n + s.stepsTotal, 0),
    outOfTolerance: out.reduce((n, s) => n + s.outOfTolerance, 0),
    approvedStages,
    due,
  };
}
