import { describe, expect, it } from "vitest";
import { buildProgress, stageState, type StageLike } from "@/lib/work-orders/build-progress";
import { allowedNextStatuses } from "@/lib/work-orders/status";

// Invented stages, shaped like the bench's stage view.
type Verdict = "in" | "low" | "high";
const step = (done: boolean, verdicts: Verdict[] = []) => ({
  done,
  current: new Map([["spec", new Map(verdicts.map((verdict, i) => [i, { verdict }]))]]),
});
const stage = (over: Partial<StageLike> & { steps: StageLike["steps"] }): StageLike => ({
  procedureName: "Bottom end",
  key: "measure",
  title: "Measure",
  allDone: over.steps.every((s) => s.done),
  signedOff: null,
  decision: null,
  ...over,
});
const signed = { at: "2026-12-02T09:00:00.000Z" };

describe("stage state for the office", () => {
  it("follows the bench: untouched, started, all done, signed off, decided", () => {
    expect(stageState(stage({ steps: [step(false), step(false)] }))).toBe("not_started");
    expect(stageState(stage({ steps: [step(true), step(false)] }))).toBe("in_progress");
    expect(stageState(stage({ steps: [step(true), step(true)] }))).toBe("ready_to_sign");
    expect(stageState(stage({ steps: [step(true)], signedOff: signed }))).toBe("waiting_review");
    expect(stageState(stage({ steps: [step(true)], signedOff: signed, decision: { decision: "approved", reason: "" } }))).toBe("approved");
    // Sent back: the bench drops the sign-off until the reopened steps are redone and signed again.
    expect(stageState(stage({ steps: [step(true), step(false)], decision: { decision: "sent_back", reason: "gap" } }))).toBe("sent_back");
    // Redone and signed off again after a send-back: back with the supervisor.
    expect(stageState(stage({ steps: [step(true)], signedOff: signed, decision: { decision: "sent_back", reason: "gap" } }))).toBe(
      "waiting_review",
    );
  });
});

describe("build progress", () => {
  it("adds up steps and current readings out of tolerance, and keeps the send-back reason", () => {
    const p = buildProgress(
      [
        stage({
          key: "measure",
          steps: [step(true, ["in", "high"]), step(false, ["low"])],
          decision: { decision: "sent_back", reason: "ring gap" },
        }),
        stage({ key: "assemble", steps: [step(false), step(false), step(false)] }),
      ],
      "in_build",
    );
    expect(p.stepsDone).toBe(1);
    expect(p.stepsTotal).toBe(5);
    expect(p.outOfTolerance).toBe(2);
    expect(p.stages.map((s) => [s.key, s.state, s.reason, s.outOfTolerance])).toEqual([
      ["measure", "sent_back", "ring gap", 2],
      ["assemble", "not_started", null, 0],
    ]);
    expect(p.due).toBeNull();
  });

  it("says when the work order's state is due to move, and only to a state the flow allows", () => {
    const approved = stage({ steps: [step(true)], signedOff: signed, decision: { decision: "approved", reason: "" } });
    const waiting = stage({ key: "b", steps: [step(true)], signedOff: signed });
    const sentBack = stage({ key: "c", steps: [step(false)], decision: { decision: "sent_back", reason: "redo" } });
    const cases = [
      { stages: [approved, waiting], status: "in_build", to: "in_review" },
      { stages: [approved, approved], status: "in_build", to: "in_review" },
      { stages: [approved, approved], status: "in_review", to: "on_dyno" },
      { stages: [approved, sentBack], status: "in_review", to: "in_build" },
      { stages: [approved, waiting], status: "in_review", to: null },
      { stages: [approved, approved], status: "on_dyno", to: null },
      { stages: [], status: "in_review", to: null },
    ] as const;
    for (const c of cases) {
      const due = buildProgress(c.stages, c.status).due;
      expect(due?.to ?? null, `${c.status} with ${c.stages.length} stages`).toBe(c.to);
      if (due) expect(allowedNextStatuses(c.status)).toContain(due.to);
    }
  });
});
