import { describe, expect, it } from "vitest";
import { buildWorkOrderView } from "@/lib/work-order-record";
import { at, completion, decision, ids, jobSnapshot, signOff, tabletOp, torqueRecord, u } from "../support/job-snapshot";

// The work-order record as the bench and the office read it (lib/work-order-record/).

const NOW = Date.parse(at(60));
const stepOf = (view: ReturnType<typeof buildWorkOrderView>, id: string) => view.steps.find((s) => s.step.id === id)!;
const stageOf = (view: ReturnType<typeof buildWorkOrderView>, key: string) => view.stages.find((s) => s.key === key)!;

describe("send-back and redo", () => {
  const sentBack = jobSnapshot({
    completions: [completion(u(101), ids.stepBore, "3")],
    signOffs: [signOff(u(102), "measure", "4")],
    reviewDecisions: [decision(u(103), "measure", "sent_back", "5", [ids.stepBore], "Bore reading looks off: measure again")],
  });

  it("a step the supervisor sent back is open again with the reason, and the stage needs a new sign-off", () => {
    const view = buildWorkOrderView(sentBack, [], NOW);
    const bore = stepOf(view, ids.stepBore);
    expect(bore).toMatchObject({
      done: false,
      donePending: false,
      reopened: { reason: "Bore reading looks off: measure again", decidedAt: at(12) },
    });
    expect(stageOf(view, "measure")).toMatchObject({
      signedOff: null,
      decision: { decision: "sent_back", reason: "Bore reading looks off: measure again" },
    });
  });

  it("a completion after the send-back (on record, or waiting on the tablet) is the redo", () => {
    const redone = jobSnapshot({ ...sentBack.state, completions: [...sentBack.state.completions, completion(u(104), ids.stepBore, "6")] });
    expect(stepOf(buildWorkOrderView(redone, [], NOW), ids.stepBore)).toMatchObject({ done: true, reopened: null });
    const waiting = buildWorkOrderView(sentBack, [tabletOp("step.completed", { stepId: ids.stepBore })], NOW);
    expect(stepOf(waiting, ids.stepBore)).toMatchObject({ done: true, donePending: true, reopened: null });
  });

  it("a completion from before the send-back does not count as the redo", () => {
    const early = jobSnapshot({
      ...sentBack.state,
      completions: [completion(u(101), ids.stepBore, "3"), completion(u(105), ids.stepBore, "2")],
    });
    expect(stepOf(buildWorkOrderView(early, [], NOW), ids.stepBore).done).toBe(false);
  });

  it("a flagged completion carries its reason", () => {
    const flagged = jobSnapshot({ completions: [completion(u(106), ids.stepBore, "3", "Job was closed when this arrived")] });
    expect(stepOf(buildWorkOrderView(flagged, [], NOW), ids.stepBore).flagged).toBe("Job was closed when this arrived");
  });
});

describe("sign-off standing", () => {
  it("an approved sign-off stands; so does a sign-off made after a send-back", () => {
    const approved = jobSnapshot({
      signOffs: [signOff(u(110), "measure", "4")],
      reviewDecisions: [decision(u(111), "measure", "approved", "5")],
    });
    expect(stageOf(buildWorkOrderView(approved, [], NOW), "measure")).toMatchObject({
      signedOff: { at: at(8), pending: false },
      canSignOff: false,
    });
    const resigned = jobSnapshot({
      completions: [completion(u(112), ids.stepBore, "3"), completion(u(113), ids.stepBore, "6")],
      signOffs: [signOff(u(114), "measure", "4"), signOff(u(115), "measure", "7")],
      reviewDecisions: [decision(u(116), "measure", "sent_back", "5", [ids.stepBore], "again")],
    });
    expect(stageOf(buildWorkOrderView(resigned, [], NOW), "measure").signedOff).toMatchObject({ id: u(115), at: at(8), pending: false });
  });

  it("a stage with every step done and no sign-off may be signed off; a sign-off waiting on the tablet counts", () => {
    const done = jobSnapshot({ completions: [completion(u(120), ids.stepBore, "3")] });
    expect(stageOf(buildWorkOrderView(done, [], NOW), "measure")).toMatchObject({ allDone: true, signedOff: null, canSignOff: true });
    const waiting = tabletOp("stage.signed-off", { jobProcedureId: ids.proc, stageKey: "measure" }, 40);
    expect(stageOf(buildWorkOrderView(done, [waiting], NOW), "measure")).toMatchObject({
      signedOff: { at: at(40), pending: true },
      canSignOff: false,
    });
  });
});

describe("holds (cure timer)", () => {
  const started = (min: number) => ({
    id: u(130),
    stepId: ids.stepSealant,
    timerSpecId: ids.cureSpec,
    label: "Sealant cure",
    durationS: 1800,
    startedAt: at(min),
    startedBy: ids.mech,
    stoppedAt: null,
    overrideBy: null,
    overrideReason: null,
  });

  it("holds the guarded step while the timer was never started, with the spec's full time", () => {
    const view = buildWorkOrderView(jobSnapshot(), [], NOW);
    expect(stepOf(view, ids.stepCase).blockedBy).toMatchObject({
      label: "Sealant cure",
      started: false,
      timerId: null,
      remainingMs: 1_800_000,
    });
    expect(stepOf(view, ids.stepSealant).missing).toContain("Start the timer: Sealant cure");
  });

  it("holds it while the timer runs, and lets go when it has run out", () => {
    const running = buildWorkOrderView(jobSnapshot({ timers: [started(50)] }), [], NOW);
    expect(stepOf(running, ids.stepCase).blockedBy).toMatchObject({ started: true, timerId: u(130), remainingMs: 20 * 60_000 });
    expect(stepOf(buildWorkOrderView(jobSnapshot({ timers: [started(20)] }), [], NOW), ids.stepCase).blockedBy).toBeNull();
  });

  it("a supervisor's override (on record or waiting) lets go at once; a timer started on the tablet holds too", () => {
    const overridden = { ...started(50), overrideBy: ids.supervisor, overrideReason: "Fast-cure sealant" };
    expect(stepOf(buildWorkOrderView(jobSnapshot({ timers: [overridden] }), [], NOW), ids.stepCase).blockedBy).toBeNull();
    const waitingOverride = tabletOp("timer.overridden", { timerId: u(130), reason: "Fast-cure sealant" });
    expect(stepOf(buildWorkOrderView(jobSnapshot({ timers: [started(50)] }), [waitingOverride], NOW), ids.stepCase).blockedBy).toBeNull();
    const startedHere = tabletOp("timer.started", {
      timerId: u(131),
      stepId: ids.stepSealant,
      timerSpecId: ids.cureSpec,
      label: "Sealant cure",
      durationS: 1800,
      startedAt: at(55),
    });
    const view = buildWorkOrderView(jobSnapshot(), [startedHere], NOW);
    expect(stepOf(view, ids.stepCase).blockedBy).toMatchObject({ started: true, timerId: u(131), remainingMs: 25 * 60_000 });
    expect(stepOf(view, ids.stepSealant).timers[0]).toMatchObject({ pending: true, done: false });
  });
});

describe("work on the tablet drawn on top of an older copy", () => {
  const bolt = (passIndex: number, b: number, id: string) =>
    tabletOp("torque.bolt-confirmed", { stepId: ids.stepBolts, torqueSpecId: ids.rodSpec, passIndex, bolt: b }, 30, id);

  it("bolts sent but not yet in the stored copy still count: the next bolt offered is the one after them", () => {
    const older = jobSnapshot({ torqueRecords: [torqueRecord(u(140), 1, 1)] }, "10");
    const view = buildWorkOrderView(older, [bolt(1, 2, u(141)), bolt(2, 1, u(142))], NOW);
    expect(stepOf(view, ids.stepBolts).torque[0].next).toEqual({ passIndex: 2, bolt: 2, positionInPass: 1 });
  });

  it("an operation the copy already holds is not counted twice", () => {
    const reading = tabletOp(
      "measurement.recorded",
      { stepId: ids.stepBore, specId: ids.boreSpec, readingIndex: 0, value: "76.004", unit: "mm" },
      30,
      u(150),
    );
    const onRecord = jobSnapshot(
      {
        readings: [
          {
            id: u(150),
            stepId: ids.stepBore,
            specId: ids.boreSpec,
            readingIndex: 0,
            value: 76.004,
            unit: "mm",
            verdict: "in",
            note: "",
            supersedesId: null,
            current: true,
            recordedBy: ids.mech,
            deviceId: "tab-1",
            deviceTime: at(30),
            stamp: reading.stamp,
            flagged: false,
            flagReason: null,
          },
        ],
      },
      "12",
    );
    const view = buildWorkOrderView(onRecord, [reading], NOW);
    expect(
      stepOf(view, ids.stepBore)
        .readings.get(ids.boreSpec)!
        .map((r) => [r.id, r.pending]),
    ).toEqual([[u(150), false]]);
    const photo = tabletOp("photo.queued", { attachmentId: u(151), stepId: ids.stepBore, contentType: "image/png", byteSize: 10 });
    const withPhoto = jobSnapshot({
      photos: [
        { id: u(151), stepId: ids.stepBore, contentType: "image/png", byteSize: 10, caption: "", awaitingUpload: true, createdAt: at(30) },
      ],
    });
    expect(stepOf(buildWorkOrderView(withPhoto, [photo], NOW), ids.stepBore).photoCount).toBe(1);
  });

  it("leaves out work for other jobs", () => {
    const other = { ...tabletOp("step.completed", { stepId: ids.stepBore }), workOrderId: u(999) };
    expect(stepOf(buildWorkOrderView(jobSnapshot(), [other], NOW), ids.stepBore).done).toBe(false);
  });
});
