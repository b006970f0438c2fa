import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { formatStamp } from "@/lib/sync/hlc";
import {
  decideOperation,
  emptyMergeState,
  mayWorkOn,
  MAX_CLOCK_AHEAD_MS,
  noteAccepted,
  sortByStamp,
  type Actor,
  type DecisionInput,
  type WorkOrderFacts,
} from "@/lib/sync/merge-rules";
import type { Operation } from "@/lib/sync/operations";
import type { WorkOrderStatus } from "@/lib/work-orders/status";

const NOW = Date.UTC(2026, 11, 2, 9, 0, 0);
const shopId = randomUUID();
const mech: Actor = { id: randomUUID(), shopId, role: "mechanic" };
const otherMech: Actor = { id: randomUUID(), shopId, role: "mechanic" };
const supervisor: Actor = { id: randomUUID(), shopId, role: "supervisor" };
const ids = {
  proc: randomUUID(),
  stepBore: randomUUID(),
  stepBolts: randomUUID(),
  stepSealant: randomUUID(),
  boreSpec: randomUUID(),
  rodSpec: randomUUID(),
  sealantTimer: randomUUID(),
};

function job(over: Partial<WorkOrderFacts> = {}): WorkOrderFacts {
  return {
    id: randomUUID(),
    shopId,
    number: 17,
    status: "in_build" as WorkOrderStatus,
    assignedMechanicId: mech.id,
    steps: new Map([
      [ids.stepBore, { key: "bore", title: "Bore gauge cylinder 1", jobProcedureId: ids.proc, stageKey: "measure" }],
      [ids.stepBolts, { key: "rod-bolts", title: "Torque rod bolts", jobProcedureId: ids.proc, stageKey: "assemble" }],
      [ids.stepSealant, { key: "sealant", title: "Sealant", jobProcedureId: ids.proc, stageKey: "assemble" }],
    ]),
    measurementSpecs: new Map([[ids.boreSpec, { stepId: ids.stepBore, label: "Cylinder 1 bore", unit: "mm", readingCount: 6 }]]),
    torqueSpecs: new Map([[ids.rodSpec, { stepId: ids.stepBolts, label: "Rod cap bolts", boltCount: 2, passCount: 3 }]]),
    timerSpecs: new Map([[ids.sealantTimer, { stepId: ids.stepSealant }]]),
    sendBacks: [],
    ...over,
  };
}

let counter = 0;
function op<K extends Operation["kind"]>(
  kind: K,
  j: WorkOrderFacts,
  payload: Extract<Operation, { kind: K }>["payload"],
  over: Partial<Operation> = {},
): Operation {
  counter += 1;
  return {
    id: randomUUID(),
    kind,
    workOrderId: j.id,
    authorId: mech.id,
    deviceId: "tab-1",
    deviceTime: new Date(NOW - 60_000).toISOString(),
    stamp: formatStamp({ wallMs: NOW - 60_000, counter, deviceId: "tab-1" }),
    payload,
    ...over,
  } as Operation;
}

function input(j: WorkOrderFacts | undefined, over: Partial<DecisionInput> = {}): DecisionInput {
  return { actor: mech, batchDeviceId: "tab-1", cursor: 100, nowMs: NOW, job: j, state: emptyMergeState(), ...over };
}

const complete = (j: WorkOrderFacts, stepId = ids.stepBore, over: Partial<Operation> = {}) => op("step.completed", j, { stepId }, over);
const reading = (j: WorkOrderFacts, extra: Partial<{ readingIndex: number; supersedesId: string; specId: string; stepId: string }> = {}) =>
  op("measurement.recorded", j, { stepId: ids.stepBore, specId: ids.boreSpec, readingIndex: 0, value: "76.0051", unit: "mm", ...extra });

describe("who may record work", () => {
  it("accepts the assigned mechanic's completion of a step on the job", () => {
    const j = job();
    expect(decideOperation(complete(j), input(j))).toEqual({ outcome: "accept" });
  });

  it("refuses an operation whose author is not the signed-in user", () => {
    const j = job();
    const d = decideOperation(complete(j, ids.stepBore, { authorId: otherMech.id }), input(j));
    expect(d).toMatchObject({ outcome: "refuse", reason: expect.stringContaining("not the signed-in user") });
  });

  it("refuses an operation made on another device than the batch's, or stamped by another device", () => {
    const j = job();
    expect(decideOperation(complete(j, ids.stepBore, { deviceId: "tab-9" }), input(j))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining('device "tab-9"'),
    });
    const stamp = formatStamp({ wallMs: NOW, counter: 0, deviceId: "tab-2" });
    expect(decideOperation(complete(j, ids.stepBore, { stamp }), input(j))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining('stamp was made by device "tab-2"'),
    });
  });

  it("refuses roles that do not reach the bench", () => {
    const j = job();
    const office: Actor = { id: mech.id, shopId, role: "office" };
    expect(decideOperation(complete(j), input(j, { actor: office }))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("(office) may not record bench work"),
    });
  });

  it("refuses work on another shop's job and on a job that does not exist", () => {
    const foreign = job({ shopId: randomUUID() });
    expect(decideOperation(complete(foreign), input(foreign))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("not in your shop"),
    });
    const ghost = job();
    expect(decideOperation(complete(ghost), input(undefined))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("not in your shop"),
    });
  });

  it("lets a mechanic work their own or an unassigned job, and a supervisor any job of the shop", () => {
    const j = job({ assignedMechanicId: otherMech.id });
    expect(decideOperation(complete(j), input(j))).toMatchObject({ outcome: "flag" });
    const open = job({ assignedMechanicId: null });
    expect(decideOperation(complete(open), input(open)).outcome).toBe("accept");
    const bySupervisor = complete(j, ids.stepBore, { authorId: supervisor.id });
    expect(decideOperation(bySupervisor, input(j, { actor: supervisor })).outcome).toBe("accept");
    expect(mayWorkOn(mech, { shopId, assignedMechanicId: mech.id })).toBe(true);
    expect(mayWorkOn(mech, { shopId: randomUUID(), assignedMechanicId: mech.id })).toBe(false);
    expect(mayWorkOn({ ...mech, role: "customer" }, { shopId, assignedMechanicId: null })).toBe(false);
  });

  it("keeps a mechanic's work on a job assigned to someone else, flagged with who has it — and when it moved, if after the work", () => {
    const j = job({ assignedMechanicId: otherMech.id, assignedMechanicName: "Priya Natarajan", assignedSinceMs: NOW - 3_600_000 });
    expect(decideOperation(complete(j), input(j))).toEqual({
      outcome: "flag",
      reason: "Work order #17 is assigned to Priya Natarajan, not to the mechanic who recorded this; kept for the supervisor to check.",
    });
    const movedAfter = job({ assignedMechanicId: otherMech.id, assignedMechanicName: "Priya Natarajan", assignedSinceMs: NOW - 30_000 });
    expect(decideOperation(complete(movedAfter), input(movedAfter))).toEqual({
      outcome: "flag",
      reason: `Work order #17 was reassigned to Priya Natarajan at ${new Date(NOW - 30_000).toISOString()}, after this was recorded; kept for the supervisor to check.`,
    });
    // with the job closed too, both reasons are given
    const closed = job({ status: "handed_over", assignedMechanicId: otherMech.id, assignedMechanicName: "Priya Natarajan" });
    const d = decideOperation(complete(closed), input(closed));
    expect(d.outcome).toBe("flag");
    expect(d.outcome === "flag" && d.reason).toMatch(/is closed \(.*\).*assigned to Priya Natarajan/);
  });
});

describe("what an operation may name", () => {
  it("refuses a step that is not in a procedure pinned on the job", () => {
    const j = job();
    const stranger = randomUUID();
    expect(decideOperation(complete(j, stranger), input(j))).toMatchObject({
      outcome: "refuse",
      reason: `Step ${stranger} is not part of a procedure on work order #17. Discard this entry with a reason; record the work again on the job as it is now.`,
    });
  });

  it("checks readings: the spec belongs to the step, the reading index is in range", () => {
    const j = job();
    expect(decideOperation(reading(j, { stepId: ids.stepBolts }), input(j))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining(`Measurement spec ${ids.boreSpec} is not a spec of step ${ids.stepBolts}`),
    });
    expect(decideOperation(reading(j, { readingIndex: 5 }), input(j)).outcome).toBe("accept");
    expect(decideOperation(reading(j, { readingIndex: 6 }), input(j))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("index 0–5"),
    });
  });

  it("accepts a correction of a reading on record for the same spot, holds one whose reading has not arrived, and refuses others", () => {
    const j = job();
    const state = emptyMergeState();
    const first = reading(j, { readingIndex: 2 });
    expect(decideOperation(reading(j, { readingIndex: 2, supersedesId: first.id }), input(j, { state }))).toEqual({
      outcome: "wait",
      target: { kind: "reading", id: first.id },
      reason: expect.stringContaining("Held on the server until the reading it corrects"),
    });
    const elsewhere = emptyMergeState();
    elsewhere.readings.set(first.id, { workOrderId: randomUUID(), specId: ids.boreSpec, readingIndex: 2 });
    expect(decideOperation(reading(j, { readingIndex: 2, supersedesId: first.id }), input(j, { state: elsewhere }))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("is not on record on work order #17"),
    });
    noteAccepted(first, state);
    expect(decideOperation(reading(j, { readingIndex: 2, supersedesId: first.id }), input(j, { state })).outcome).toBe("accept");
    expect(decideOperation(reading(j, { readingIndex: 3, supersedesId: first.id }), input(j, { state }))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("another spec or reading index"),
    });
  });

  it("checks torque passes and bolts against the spec", () => {
    const j = job();
    const bolt = (passIndex: number, b: number) =>
      op("torque.bolt-confirmed", j, { stepId: ids.stepBolts, torqueSpecId: ids.rodSpec, passIndex, bolt: b });
    expect(decideOperation(bolt(3, 2), input(j)).outcome).toBe("accept");
    expect(decideOperation(bolt(4, 1), input(j))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("Pass 4 is out of range"),
    });
    expect(decideOperation(bolt(1, 3), input(j))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("Bolt 3 is out of range"),
    });
  });

  it("checks timers: one start per timer, a stop needs a start on the same job and not before it", () => {
    const j = job();
    const state = emptyMergeState();
    const timerId = randomUUID();
    const startedAt = new Date(NOW - 3_600_000).toISOString();
    const start = op("timer.started", j, {
      timerId,
      stepId: ids.stepSealant,
      timerSpecId: ids.sealantTimer,
      label: "Cure",
      durationS: 1800,
      startedAt,
    });
    const stop = (at: number) => op("timer.stopped", j, { timerId, stoppedAt: new Date(at).toISOString() });
    expect(decideOperation(stop(NOW), input(j, { state }))).toMatchObject({
      outcome: "wait",
      target: { kind: "timer", id: timerId },
      reason: expect.stringContaining(`until the start of timer ${timerId} arrives`),
    });
    expect(decideOperation(start, input(j, { state })).outcome).toBe("accept");
    noteAccepted(start, state);
    expect(decideOperation({ ...start, id: randomUUID() }, input(j, { state }))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringMatching(new RegExp(`^Timer ${timerId} is already on record\\. Discard`)),
    });
    expect(decideOperation(stop(NOW - 7_200_000), input(j, { state }))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("before it started"),
    });
    expect(decideOperation(stop(NOW), input(j, { state })).outcome).toBe("accept");
    const wrongSpec = op("timer.started", j, {
      timerId: randomUUID(),
      stepId: ids.stepBore,
      timerSpecId: ids.sealantTimer,
      label: "x",
      durationS: 5,
      startedAt,
    });
    expect(decideOperation(wrongSpec, input(j))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("is not a timer of step"),
    });
  });

  it("keeps the earliest stop of a timer, whatever order stops come in", () => {
    const j = job();
    const state = emptyMergeState();
    const timerId = randomUUID();
    noteAccepted(
      op("timer.started", j, {
        timerId,
        stepId: ids.stepSealant,
        label: "Cure",
        durationS: 60,
        startedAt: new Date(NOW - 10_000).toISOString(),
      }),
      state,
    );
    noteAccepted(op("timer.stopped", j, { timerId, stoppedAt: new Date(NOW - 2_000).toISOString() }), state);
    noteAccepted(op("timer.stopped", j, { timerId, stoppedAt: new Date(NOW - 5_000).toISOString() }), state);
    noteAccepted(op("timer.stopped", j, { timerId, stoppedAt: new Date(NOW - 1_000).toISOString() }), state);
    expect(state.timers.get(timerId)?.stoppedAtMs).toBe(NOW - 5_000);
  });

  it("refuses a photo id already on record and a sign-off of a stage not on the procedure", () => {
    const j = job();
    const state = emptyMergeState();
    const photo = op("photo.queued", j, { attachmentId: randomUUID(), stepId: ids.stepBore, contentType: "image/jpeg", byteSize: 2048 });
    expect(decideOperation(photo, input(j, { state })).outcome).toBe("accept");
    noteAccepted(photo, state);
    expect(decideOperation({ ...photo, id: randomUUID() }, input(j, { state }))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("already on record"),
    });
    expect(decideOperation(op("stage.signed-off", j, { jobProcedureId: ids.proc, stageKey: "measure" }), input(j)).outcome).toBe("accept");
    expect(decideOperation(op("stage.signed-off", j, { jobProcedureId: ids.proc, stageKey: "paint" }), input(j))).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining('Stage "paint" is not a stage'),
    });
    const otherProc = randomUUID();
    expect(decideOperation(op("stage.signed-off", j, { jobProcedureId: otherProc, stageKey: "measure" }), input(j))).toMatchObject({
      outcome: "refuse",
      reason: `Procedure ${otherProc} is not on work order #17. Discard this entry with a reason; record the work again on the job as it is now.`,
    });
  });
});

describe("flags: kept, but marked for review", () => {
  it("flags work on a closed job and on a job not open for bench work", () => {
    const closed = job({ status: "handed_over" });
    expect(decideOperation(complete(closed), input(closed))).toMatchObject({
      outcome: "flag",
      reason: expect.stringContaining("closed (Handed over)"),
    });
    const quoted = job({ status: "quoted" });
    expect(decideOperation(reading(quoted), input(quoted))).toMatchObject({
      outcome: "flag",
      reason: expect.stringContaining("not open for bench work (Quoted)"),
    });
  });

  it("flags a completion of a sent-back step the tablet had not yet heard of", () => {
    const decidedAtMs = NOW - 30_000;
    const j = job({
      sendBacks: [{ decisionId: randomUUID(), stepIds: [ids.stepBore], seq: 150, decidedAtMs, reason: "Re-measure at room temperature" }],
    });
    // the tablet's cursor (100) is older than the decision (150)
    expect(decideOperation(complete(j), input(j, { cursor: 100 }))).toMatchObject({
      outcome: "flag",
      reason: expect.stringContaining("Re-measure at room temperature"),
    });
    expect(decideOperation(complete(j), input(j, { cursor: null })).outcome).toBe("flag");
    // the tablet had the decision, but the completion was made before it (an earlier outbox entry)
    expect(decideOperation(complete(j), input(j, { cursor: 150 })).outcome).toBe("flag");
    // the tablet had the decision and the completion came after it: a redo
    const redo = complete(j, ids.stepBore, { stamp: formatStamp({ wallMs: decidedAtMs + 1_000, counter: 0, deviceId: "tab-1" }) });
    expect(decideOperation(redo, input(j, { cursor: 150 }))).toEqual({ outcome: "accept" });
    // other steps are not affected
    expect(decideOperation(complete(j, ids.stepBolts), input(j, { cursor: 100 })).outcome).toBe("accept");
  });

  it("flags a sign-off of a stage holding a sent-back step the tablet had not heard of", () => {
    const j = job({
      sendBacks: [{ decisionId: randomUUID(), stepIds: [ids.stepBolts], seq: 150, decidedAtMs: NOW - 30_000, reason: "Bolt 2 not marked" }],
    });
    expect(decideOperation(op("stage.signed-off", j, { jobProcedureId: ids.proc, stageKey: "assemble" }), input(j))).toMatchObject({
      outcome: "flag",
      reason: expect.stringContaining("Bolt 2 not marked"),
    });
    expect(decideOperation(op("stage.signed-off", j, { jobProcedureId: ids.proc, stageKey: "measure" }), input(j)).outcome).toBe("accept");
  });

  it("flags a stamp from a clock far ahead of the server's", () => {
    const j = job();
    const ahead = complete(j, ids.stepBore, {
      stamp: formatStamp({ wallMs: NOW + MAX_CLOCK_AHEAD_MS + 3 * 60_000, counter: 0, deviceId: "tab-1" }),
    });
    expect(decideOperation(ahead, input(j))).toMatchObject({
      outcome: "flag",
      reason: expect.stringContaining("min ahead of the server clock"),
    });
  });

  it("does not flag refused operations: a refusal wins", () => {
    const closed = job({ status: "cancelled" });
    expect(decideOperation(complete(closed, randomUUID()), input(closed)).outcome).toBe("refuse");
  });
});

describe("order", () => {
  it("applies operations by stamp, then id, whatever order they arrived in", () => {
    const a = { id: "b", stamp: formatStamp({ wallMs: 10, counter: 1, deviceId: "x" }) };
    const b = { id: "a", stamp: formatStamp({ wallMs: 10, counter: 1, deviceId: "x" }) };
    const c = { id: "c", stamp: formatStamp({ wallMs: 9, counter: 5, deviceId: "z" }) };
    const d = { id: "d", stamp: formatStamp({ wallMs: 10, counter: 0, deviceId: "y" }) };
    expect(sortByStamp([a, b, c, d]).map((o) => o.id)).toEqual(["c", "d", "a", "b"]);
  });
});
