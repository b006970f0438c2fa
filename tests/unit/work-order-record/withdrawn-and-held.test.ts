import { describe, expect, it } from "vitest";
import { buildWorkOrderView } from "@/lib/work-order-record";
import { at, completion, ids, jobSnapshot, signOff, tabletOp, torqueRecord, u } from "../support/job-snapshot";

// The record as the bench reads it: withdrawn entries stay listed, marked, and no longer count;
// a held step is held by the one rule of lib/sync/holds.ts; readings show exactly as typed.

const NOW = Date.parse(at(60));
const stepOf = (view: ReturnType<typeof buildWorkOrderView>, id: string) => view.steps.find((s) => s.step.id === id)!;
const stageOf = (view: ReturnType<typeof buildWorkOrderView>, key: string) => view.stages.find((s) => s.key === key)!;
const withdrawal = (id: string, operationId: string, kind: "torque.bolt-confirmed" | "step.completed" | "stage.signed-off") => ({
  id,
  operationId,
  kind,
  withdrawnBy: ids.mech,
  reason: "recorded by mistake",
  deviceTime: at(40),
  receivedAt: at(41),
});

describe("withdrawn entries", () => {
  it("a withdrawn bolt no longer counts: the confirm offers it again, and it stays listed, marked", () => {
    const snap = jobSnapshot({
      torqueRecords: [torqueRecord(u(200), 1, 1), torqueRecord(u(201), 1, 2)],
      withdrawals: [withdrawal(u(202), u(201), "torque.bolt-confirmed")],
    });
    const torque = stepOf(buildWorkOrderView(snap, [], NOW), ids.stepBolts).torque[0];
    expect(torque.next).toEqual({ passIndex: 1, bolt: 2, positionInPass: 1 });
    expect([...torque.confirmed]).toEqual(["1:1"]);
    expect(torque.records.map((r) => [r.operationId, r.withdrawn?.reason ?? null])).toEqual([
      [u(200), null],
      [u(201), "recorded by mistake"],
    ]);
  });

  it("a withdrawal still on the tablet counts at once", () => {
    const snap = jobSnapshot({ torqueRecords: [torqueRecord(u(210), 1, 1)] });
    const take = tabletOp("entry.withdrawn", { operationId: u(210), reason: "wrong bolt" });
    const torque = stepOf(buildWorkOrderView(snap, [take], NOW), ids.stepBolts).torque[0];
    expect(torque.next).toMatchObject({ passIndex: 1, bolt: 1 });
    expect(torque.records[0].withdrawn).toMatchObject({ reason: "wrong bolt", pending: true });
  });

  it("a withdrawn completion leaves the step to do again", () => {
    const snap = jobSnapshot({
      completions: [completion(u(220), ids.stepBore, "3")],
      withdrawals: [withdrawal(u(221), u(220), "step.completed")],
    });
    expect(stepOf(buildWorkOrderView(snap, [], NOW), ids.stepBore)).toMatchObject({ done: false, completions: [] });
    const redo = tabletOp("step.completed", { stepId: ids.stepBore });
    expect(stepOf(buildWorkOrderView(snap, [redo], NOW), ids.stepBore)).toMatchObject({ done: true, donePending: true });
  });

  it("a withdrawn sign-off reopens the stage for sign-off", () => {
    const snap = jobSnapshot({
      completions: [completion(u(230), ids.stepBore, "3")],
      signOffs: [signOff(u(231), "measure", "4")],
      withdrawals: [withdrawal(u(232), u(231), "stage.signed-off")],
    });
    expect(stageOf(buildWorkOrderView(snap, [], NOW), "measure")).toMatchObject({ signedOff: null, canSignOff: true });
  });

  it("a withdrawn photo no longer counts for a step that needs one", () => {
    const snap = jobSnapshot();
    const photo = tabletOp(
      "photo.queued",
      { attachmentId: u(240), stepId: ids.stepBore, contentType: "image/png", byteSize: 10 },
      30,
      u(241),
    );
    const view = buildWorkOrderView(snap, [photo, tabletOp("entry.withdrawn", { operationId: u(241), reason: "wrong step" })], NOW);
    expect(stepOf(view, ids.stepBore)).toMatchObject({
      photoCount: 0,
      photos: [{ attachmentId: u(240), withdrawn: { reason: "wrong step" } }],
    });
  });
});

describe("readings as typed", () => {
  it("shows the stored text, trailing zeros included; an older copy without it shows the number's decimal", () => {
    const reading = (id: string, valueText: string | undefined, value: number) => ({
      id,
      stepId: ids.stepBore,
      specId: ids.boreSpec,
      readingIndex: id === u(250) ? 0 : 1,
      value,
      ...(valueText === undefined ? {} : { valueText }),
      unit: "mm" as const,
      verdict: "in" as const,
      note: "",
      supersedesId: null,
      current: true,
      recordedBy: ids.mech,
      deviceId: "tab-1",
      deviceTime: at(10),
      stamp: `${String(Date.parse(at(10))).padStart(15, "0")}-000001-tab-1`,
      flagged: false,
      flagReason: null,
    });
    const snap = jobSnapshot({ readings: [reading(u(250), "76.0050", 76.005), reading(u(251), undefined, 76.004)] });
    const current = stepOf(buildWorkOrderView(snap, [], NOW), ids.stepBore).current.get(ids.boreSpec)!;
    expect(current.get(0)!.value).toBe("76.0050");
    expect(current.get(1)!.value).toBe("76.004");
    const typed = tabletOp("measurement.recorded", {
      stepId: ids.stepBore,
      specId: ids.boreSpec,
      readingIndex: 0,
      value: "76.0100",
      unit: "mm",
    });
    expect(
      stepOf(buildWorkOrderView(snap, [typed], NOW), ids.stepBore)
        .current.get(ids.boreSpec)!
        .get(0),
    ).toMatchObject({
      value: "76.0100",
      verdict: "in", // the limit, 76.01, is in
    });
  });
});

describe("holds on the tablet", () => {
  const timer = (id: string, startMin: number, over: Record<string, unknown> = {}) => ({
    id,
    stepId: ids.stepSealant,
    timerSpecId: ids.cureSpec,
    label: "Sealant cure",
    durationS: 1800,
    startedAt: at(startMin),
    startedBy: ids.mech,
    stoppedAt: null,
    overrideBy: null,
    overrideReason: null,
    ...over,
  });

  it("a timer stopped before its time keeps the step held, saying so", () => {
    const snap = jobSnapshot({ timers: [timer(u(260), 10, { stoppedAt: at(20), stopReason: "cases came apart" })] });
    const view = buildWorkOrderView(snap, [], NOW);
    expect(stepOf(view, ids.stepCase).blockedBy).toMatchObject({ why: "stopped-early", timerId: u(260) });
    expect(stepOf(view, ids.stepSealant).timers[0]).toMatchObject({ stoppedEarly: true, stopReason: "cases came apart", done: false });
  });

  it("a cancelled timer does not count: the wait is back to not started (and the step asks for the timer again)", () => {
    const snap = jobSnapshot({ timers: [timer(u(261), 10)] });
    const cancel = tabletOp("timer.cancelled", { timerId: u(261), reason: "started on the wrong job" });
    const view = buildWorkOrderView(snap, [cancel], NOW);
    expect(stepOf(view, ids.stepCase).blockedBy).toMatchObject({ why: "not-started", started: false });
    expect(stepOf(view, ids.stepSealant).missing).toContain("Start the timer: Sealant cure");
  });

  it("two timers of one wait: the step is held until the later one is done", () => {
    const snap = jobSnapshot({ timers: [timer(u(262), 10), timer(u(263), 45)] });
    expect(stepOf(buildWorkOrderView(snap, [], NOW), ids.stepCase).blockedBy).toMatchObject({
      why: "running",
      timerId: u(263),
      remainingMs: 15 * 60_000,
    });
  });
});
