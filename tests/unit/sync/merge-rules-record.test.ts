import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { formatStamp } from "@/lib/sync/hlc";
import {
  decideOperation,
  emptyMergeState,
  noteAccepted,
  type Actor,
  type DecisionInput,
  type MergeState,
  type WorkOrderFacts,
} from "@/lib/sync/merge-rules";
import type { Operation } from "@/lib/sync/operations";

// The merge rules added for the record's integrity: two tablets on one bolt, holds, timers stopped
// or cancelled, withdrawals. Invented job: a rod-bolt step (stretch bolts), a case-bolt step whose
// cure timer holds the oil fill.

const NOW = Date.UTC(2026, 11, 3, 10, 0, 0);
const shopId = randomUUID();
const mech: Actor = { id: randomUUID(), shopId, role: "mechanic" };
const mech2: Actor = { id: randomUUID(), shopId, role: "mechanic" };
const sup: Actor = { id: randomUUID(), shopId, role: "supervisor" };
const ids = {
  proc: randomUUID(),
  stepRod: randomUUID(),
  stepCase: randomUUID(),
  stepOil: randomUUID(),
  rodSpec: randomUUID(),
  caseSpec: randomUUID(),
  cure: randomUUID(),
};

function job(over: Partial<WorkOrderFacts> = {}): WorkOrderFacts {
  return {
    id: randomUUID(),
    shopId,
    number: 1021,
    status: "in_build",
    assignedMechanicId: null,
    steps: new Map([
      [ids.stepRod, { key: "rod-bolts", title: "Torque connecting-rod bolts", jobProcedureId: ids.proc, stageKey: "assemble" }],
      [ids.stepCase, { key: "case-bolts", title: "Torque crankcase bolts", jobProcedureId: ids.proc, stageKey: "assemble" }],
      [ids.stepOil, { key: "oil-prime", title: "Fill with oil and prime the oil system", jobProcedureId: ids.proc, stageKey: "assemble" }],
    ]),
    measurementSpecs: new Map(),
    torqueSpecs: new Map([
      [ids.rodSpec, { stepId: ids.stepRod, label: "Rod cap bolts, rod 1", boltCount: 2, passCount: 3, torqueToYield: true }],
      [ids.caseSpec, { stepId: ids.stepCase, label: "Main case bolts M9", boltCount: 10, passCount: 3, torqueToYield: false }],
    ]),
    timerSpecs: new Map([[ids.cure, { stepId: ids.stepCase }]]),
    sendBacks: [],
    holds: new Map([[ids.stepOil, [{ timerSpecId: ids.cure, label: "Sealant cure before oil and cranking" }]]]),
    ...over,
  };
}

let counter = 0;
function op<K extends Operation["kind"]>(
  kind: K,
  j: WorkOrderFacts,
  payload: Extract<Operation, { kind: K }>["payload"],
  by: Actor = mech,
  atMs = NOW - 60_000,
  device = by === mech ? "tab-a" : by === mech2 ? "tab-b" : "tab-s",
): Extract<Operation, { kind: K }> {
  counter += 1;
  return {
    id: randomUUID(),
    kind,
    workOrderId: j.id,
    authorId: by.id,
    deviceId: device,
    deviceTime: new Date(atMs).toISOString(),
    stamp: formatStamp({ wallMs: atMs, counter, deviceId: device }),
    payload,
  } as Extract<Operation, { kind: K }>;
}

function decide(o: Operation, j: WorkOrderFacts, state: MergeState, actor: Actor = mech) {
  const input: DecisionInput = { actor, batchDeviceId: o.deviceId, cursor: 100, nowMs: NOW, job: j, state };
  const d = decideOperation(o, input);
  if (d.outcome !== "refuse") noteAccepted(o, state);
  return d;
}

const bolt = (j: WorkOrderFacts, spec: string, passIndex: number, b: number, by: Actor = mech, atMs?: number) =>
  op(
    "torque.bolt-confirmed",
    j,
    { stepId: spec === ids.rodSpec ? ids.stepRod : ids.stepCase, torqueSpecId: spec, passIndex, bolt: b },
    by,
    atMs,
  );

describe("two tablets on one bolt", () => {
  it("a bolt and pass recorded a second time is kept and flagged, naming where the first came from", () => {
    const j = job();
    const state = emptyMergeState();
    expect(decide(bolt(j, ids.caseSpec, 1, 4), j, state)).toEqual({ outcome: "accept" });
    const again = decide(bolt(j, ids.caseSpec, 1, 4, mech2), j, state, mech2);
    expect(again).toMatchObject({ outcome: "flag" });
    expect(again.outcome === "flag" && again.reason).toMatch(
      /^Bolt 4, pass 1 of “Main case bolts M9” was already recorded \(tablet tab-a, .* UTC\)/,
    );
    expect(again.outcome === "flag" && again.reason).not.toContain("TORQUE-TO-YIELD");
    // the same bolt on another pass, or another bolt, is not a repeat
    expect(decide(bolt(j, ids.caseSpec, 2, 4), j, state)).toEqual({ outcome: "accept" });
  });

  it("the same tablet recording it twice is flagged too", () => {
    const j = job();
    const state = emptyMergeState();
    decide(bolt(j, ids.caseSpec, 1, 1), j, state);
    expect(decide(bolt(j, ids.caseSpec, 1, 1), j, state).outcome).toBe("flag");
  });

  it("for a torque-to-yield bolt the flag says so first, louder", () => {
    const j = job();
    const state = emptyMergeState();
    decide(bolt(j, ids.rodSpec, 3, 2), j, state);
    const d = decide(bolt(j, ids.rodSpec, 3, 2, mech2), j, state, mech2);
    expect(d.outcome === "flag" && d.reason).toMatch(/^TORQUE-TO-YIELD BOLT RECORDED TWICE: Bolt 2, pass 3 of “Rod cap bolts, rod 1”/);
    expect(d.outcome === "flag" && d.reason).toContain("fit a new bolt if in doubt");
  });

  it("a bolt withdrawn and then done again is not a repeat", () => {
    const j = job();
    const state = emptyMergeState();
    const first = bolt(j, ids.caseSpec, 1, 7);
    decide(first, j, state);
    expect(decide(op("entry.withdrawn", j, { operationId: first.id, reason: "wrong bolt, was 8" }), j, state).outcome).toBe("accept");
    expect(decide(bolt(j, ids.caseSpec, 1, 7), j, state)).toEqual({ outcome: "accept" });
  });
});

describe("holds hold", () => {
  const startCure = (j: WorkOrderFacts, startMs: number, by: Actor = mech, timerId = randomUUID()) =>
    op(
      "timer.started",
      j,
      {
        timerId,
        stepId: ids.stepCase,
        timerSpecId: ids.cure,
        label: "Sealant cure before oil and cranking",
        durationS: 1800,
        startedAt: new Date(startMs).toISOString(),
      },
      by,
      startMs,
    );
  const oilDone = (j: WorkOrderFacts, atMs: number, by: Actor = mech) => op("step.completed", j, { stepId: ids.stepOil }, by, atMs);

  it("work on the held step stamped while the cure runs is kept and flagged, saying what it waited for", () => {
    const j = job();
    const state = emptyMergeState();
    decide(startCure(j, NOW - 20 * 60_000), j, state);
    const d = decide(oilDone(j, NOW - 5 * 60_000), j, state);
    expect(d.outcome).toBe("flag");
    expect(d.outcome === "flag" && d.reason).toMatch(
      /^Step “Fill with oil and prime the oil system” was on hold when this was recorded \(.* UTC\): “Sealant cure before oil and cranking” was running until \d\d:\d\d UTC\./,
    );
  });

  it("work stamped after the cure ran its full time is accepted", () => {
    const j = job();
    const state = emptyMergeState();
    decide(startCure(j, NOW - 40 * 60_000), j, state);
    expect(decide(oilDone(j, NOW - 5 * 60_000), j, state)).toEqual({ outcome: "accept" });
  });

  it("work on the held step before the cure was even started is flagged", () => {
    const j = job();
    const d = decide(oilDone(j, NOW - 5 * 60_000), j, emptyMergeState());
    expect(d.outcome === "flag" && d.reason).toContain("“Sealant cure before oil and cranking” had not been started");
  });

  it("a supervisor's override releases the step from the time it was made; work before it stays flagged", () => {
    const j = job();
    const state = emptyMergeState();
    const start = startCure(j, NOW - 20 * 60_000);
    decide(start, j, state);
    const override = op("timer.overridden", j, { timerId: start.payload.timerId, reason: "Fast-cure sealant" }, sup, NOW - 10 * 60_000);
    expect(decide(override, j, state, sup).outcome).toBe("accept");
    expect(decide(oilDone(j, NOW - 12 * 60_000), j, state).outcome).toBe("flag");
    expect(decide(oilDone(j, NOW - 9 * 60_000), j, state).outcome).toBe("accept");
  });

  it("a cure stopped before its time keeps the step held, whoever stopped it", () => {
    const j = job();
    const state = emptyMergeState();
    const start = startCure(j, NOW - 50 * 60_000);
    decide(start, j, state);
    const stop = op("timer.stopped", j, {
      timerId: start.payload.timerId,
      stoppedAt: new Date(NOW - 45 * 60_000).toISOString(),
      reason: "Cases had to come apart",
    });
    expect(decide(stop, j, state).outcome).toBe("accept");
    const d = decide(oilDone(j, NOW - 5 * 60_000), j, state);
    expect(d.outcome === "flag" && d.reason).toContain("had been stopped before its time was up");
  });

  it("only work a hold stops is checked: a photo of the held step is not flagged", () => {
    const j = job();
    const photo = op("photo.queued", j, { attachmentId: randomUUID(), stepId: ids.stepOil, contentType: "image/jpeg", byteSize: 10 });
    expect(decide(photo, j, emptyMergeState())).toEqual({ outcome: "accept" });
  });
});

describe("timers started twice, stopped or cancelled", () => {
  it("two tablets starting the same wait offline: both kept, the second flagged", () => {
    const j = job();
    const state = emptyMergeState();
    const t = (by: Actor, startMs: number) =>
      op(
        "timer.started",
        j,
        {
          timerId: randomUUID(),
          stepId: ids.stepCase,
          timerSpecId: ids.cure,
          label: "Sealant cure",
          durationS: 1800,
          startedAt: new Date(startMs).toISOString(),
        },
        by,
        startMs,
      );
    expect(decide(t(mech, NOW - 90 * 60_000), j, state)).toEqual({ outcome: "accept" });
    const second = decide(t(mech2, NOW - 85 * 60_000), j, state, mech2);
    expect(second.outcome === "flag" && second.reason).toMatch(
      /^A second “Sealant cure” timer was started while one started at .* UTC was still running/,
    );
    // a new run after the first ran out is a deliberate restart, not a repeat
    expect(decide(t(mech, NOW - 10 * 60_000), j, state)).toEqual({ outcome: "accept" });
  });

  it("the same two timers arriving the other way round: the earlier-started one, arriving second, is flagged too", () => {
    const j = job();
    const state = emptyMergeState();
    const t = (by: Actor, startMs: number) =>
      op(
        "timer.started",
        j,
        {
          timerId: randomUUID(),
          stepId: ids.stepCase,
          timerSpecId: ids.cure,
          label: "Sealant cure",
          durationS: 1800,
          startedAt: new Date(startMs).toISOString(),
        },
        by,
        startMs,
      );
    expect(decide(t(mech2, NOW - 85 * 60_000), j, state, mech2)).toEqual({ outcome: "accept" });
    const earlier = decide(t(mech, NOW - 90 * 60_000), j, state);
    expect(earlier.outcome === "flag" && earlier.reason).toMatch(
      /^A second “Sealant cure” timer was started at .* UTC while this one \(started at .* UTC\) was still running/,
    );
    // one started long before, that had run out when the other started, is not a repeat
    expect(decide(t(mech, NOW - 200 * 60_000), j, state)).toEqual({ outcome: "accept" });
  });

  it("a timer is cancelled by whoever started it or a supervisor; another mechanic is refused", () => {
    const j = job();
    const state = emptyMergeState();
    const timerId = randomUUID();
    decide(
      op("timer.started", j, {
        timerId,
        stepId: ids.stepCase,
        timerSpecId: ids.cure,
        label: "Cure",
        durationS: 1800,
        startedAt: new Date(NOW - 60_000).toISOString(),
      }),
      j,
      state,
    );
    const byOther = op("timer.cancelled", j, { timerId, reason: "started twice" }, mech2);
    expect(decide(byOther, j, state, mech2)).toEqual({
      outcome: "refuse",
      reason: "Only the person who started this timer, or a supervisor, may cancel it: a mechanic cannot cancel someone else's timer.",
    });
    expect(decide(op("timer.cancelled", j, { timerId, reason: "started twice" }, sup), j, state, sup).outcome).toBe("accept");
    expect(state.timers.get(timerId)?.cancelled).toBe(true);
  });

  it("a cancel naming a timer not on file yet is held until the timer's start arrives (as a stop is)", () => {
    const j = job();
    const timerId = randomUUID();
    expect(decide(op("timer.cancelled", j, { timerId, reason: "mistake" }), j, emptyMergeState())).toMatchObject({
      outcome: "wait",
      target: { kind: "timer", id: timerId },
      reason: expect.stringContaining(`until the start of timer ${timerId} arrives`),
    });
  });
});

describe("withdrawing an entry", () => {
  it("the author withdraws their own bolt, completion, part, photo or sign-off", () => {
    const j = job();
    const state = emptyMergeState();
    const entries: Operation[] = [
      bolt(j, ids.caseSpec, 1, 1),
      op("step.completed", j, { stepId: ids.stepCase }),
      op("part.fitted", j, {
        partFittedId: randomUUID(),
        stepId: ids.stepCase,
        partNumber: "GS-1",
        description: "Case dowel",
        batch: "B1",
        quantity: 2,
      }),
      op("photo.queued", j, { attachmentId: randomUUID(), stepId: ids.stepCase, contentType: "image/jpeg", byteSize: 10 }),
      op("stage.signed-off", j, { jobProcedureId: ids.proc, stageKey: "assemble" }),
    ];
    for (const e of entries) decide(e, j, state);
    for (const e of entries)
      expect(decide(op("entry.withdrawn", j, { operationId: e.id, reason: "recorded by mistake" }), j, state)).toEqual({
        outcome: "accept",
      });
  });

  it("a mechanic cannot withdraw someone else's entry (forgery-class), a supervisor can", () => {
    const j = job();
    const state = emptyMergeState();
    const theirs = bolt(j, ids.caseSpec, 1, 2, mech2);
    decide(theirs, j, state, mech2);
    const d = decide(op("entry.withdrawn", j, { operationId: theirs.id, reason: "not me" }), j, state);
    expect(d).toEqual({
      outcome: "refuse",
      reason:
        "Only the person who recorded this torque bolt, or a supervisor, may withdraw it: a mechanic cannot take back someone else's entry (that would be recording in their name).",
    });
    expect(decide(op("entry.withdrawn", j, { operationId: theirs.id, reason: "double entry" }, sup), j, state, sup)).toEqual({
      outcome: "accept",
    });
  });

  it("a reading is corrected, not withdrawn; a timer is stopped or cancelled; a withdrawal stays", () => {
    const j = job({
      measurementSpecs: new Map([[ids.cure, { stepId: ids.stepCase, label: "Gap", readingCount: 1, unit: "mm" as const }]]),
    });
    const state = emptyMergeState();
    const r = op("measurement.recorded", j, { stepId: ids.stepCase, specId: ids.cure, readingIndex: 0, value: "0.030", unit: "mm" });
    decide(r, j, state);
    expect(decide(op("entry.withdrawn", j, { operationId: r.id, reason: "typo" }), j, state)).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("A reading is not withdrawn: it is corrected."),
    });
    // an entry not on record (yet) is waited for: the withdrawal is held until it arrives
    const missing = randomUUID();
    const w = op("entry.withdrawn", j, { operationId: missing, reason: "x-x" });
    expect(decide(w, j, state)).toEqual({
      outcome: "wait",
      target: { kind: "entry", id: missing },
      reason: `Held on the server until the entry it withdraws (${missing}) arrives; it is applied then, in stamp order.`,
    });
    const b = bolt(j, ids.caseSpec, 1, 3);
    decide(b, j, state);
    const w2 = op("entry.withdrawn", j, { operationId: b.id, reason: "wrong" });
    decide(w2, j, state);
    expect(decide(op("entry.withdrawn", j, { operationId: w2.id, reason: "undo" }), j, state)).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining("A withdrawal cannot itself be withdrawn"),
    });
  });

  it("an entry of another job is not on record here", () => {
    const a = job();
    const b = job();
    const state = emptyMergeState();
    const onA = bolt(a, ids.caseSpec, 1, 1);
    decide(onA, a, state);
    expect(decide(op("entry.withdrawn", b, { operationId: onA.id, reason: "oops" }), b, state)).toMatchObject({
      outcome: "refuse",
      reason: expect.stringContaining(`The entry ${onA.id} to withdraw is not on record on work order #${b.number}.`),
    });
  });

  it("a sign-off withdrawn after a supervisor decided on it is kept and flagged", () => {
    const j = job();
    const state = emptyMergeState();
    const so = op("stage.signed-off", j, { jobProcedureId: ids.proc, stageKey: "assemble" });
    decide(so, j, state);
    state.entries.get(so.id)!.decided = true;
    const d = decide(op("entry.withdrawn", j, { operationId: so.id, reason: "step was not done" }), j, state);
    expect(d.outcome === "flag" && d.reason).toContain("had already been decided on by a supervisor");
  });
});
