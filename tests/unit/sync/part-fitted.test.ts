import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { formatStamp } from "@/lib/sync/hlc";
import { decideOperation, emptyMergeState, noteAccepted, type Actor, type WorkOrderFacts } from "@/lib/sync/merge-rules";
import { operationSchema, partFittedPayload, type Operation } from "@/lib/sync/operations";
import { partSerialOnWorkOrder, serialKey } from "@/lib/sync/parts";

// The `part.fitted` operation: its payload schema (what a tablet may send, and the messages when
// not) and its merge rules (step on the job, one row per record id, a repeated serial flagged).

const good = (): {
  partFittedId: string;
  stepId: string;
  partNumber: string;
  description: string;
  serial?: string;
  batch?: string;
  quantity: number;
  supplier?: string;
} => ({
  partFittedId: randomUUID(),
  stepId: randomUUID(),
  partNumber: "GS-PST-7600",
  description: "Forged piston, 76.00 mm",
  serial: "GS-0042",
  quantity: 1,
});

/** The issues of a bad payload as [field, message]. */
function issues(payload: unknown): Array<[string, string]> {
  const r = partFittedPayload.safeParse(payload);
  expect(r.success).toBe(false);
  return r.error!.issues.map((i) => [i.path.join("."), i.message]);
}

describe("part.fitted payload", () => {
  it("takes a serial-numbered part, trimming the texts", () => {
    const p = { ...good(), partNumber: "  GS-PST-7600 ", serial: " GS-0042\u00a0", supplier: " Harbour Pistons " };
    const r = partFittedPayload.parse(p);
    expect(r).toEqual({ ...p, partNumber: "GS-PST-7600", serial: "GS-0042", supplier: "Harbour Pistons" });
  });

  it("takes a batch-numbered part with a quantity, and a part with both numbers", () => {
    const { serial: _s, ...noSerial } = good();
    expect(
      partFittedPayload.parse({ ...noSerial, partNumber: "HS-10-120", description: "Head stud", batch: "L24-118", quantity: 12 }).quantity,
    ).toBe(12);
    expect(partFittedPayload.parse({ ...good(), batch: "L24-118" }).batch).toBe("L24-118");
  });

  it("needs a serial number or a batch number, naming the serial field", () => {
    const { serial: _s, ...neither } = good();
    expect(issues(neither)).toEqual([
      ["serial", "give the serial number or the batch number (or both), so the record shows which part went in"],
    ]);
  });

  it("keeps a serial-numbered part to quantity 1", () => {
    expect(issues({ ...good(), quantity: 2 })).toEqual([
      ["quantity", "a serial number names one part: record each serial-numbered part on its own, with quantity 1"],
    ]);
  });

  it("wants a whole quantity from 1 to 1000", () => {
    const { serial: _s, ...batchOnly } = { ...good(), batch: "L1" };
    expect(issues({ ...batchOnly, quantity: 0 })).toEqual([["quantity", "quantity must be at least 1"]]);
    expect(issues({ ...batchOnly, quantity: 2.5 })).toEqual([["quantity", "quantity must be a whole number"]]);
    expect(issues({ ...batchOnly, quantity: 1001 })).toEqual([["quantity", "quantity must be at most 1000"]]);
    expect(issues({ ...batchOnly, quantity: "3" })).toEqual([["quantity", "quantity must be a whole number"]]);
  });

  it("names an empty or missing part number and description", () => {
    expect(issues({ ...good(), partNumber: "   ", description: "" })).toEqual([
      ["partNumber", "enter the part number"],
      ["description", "enter the description"],
    ]);
    const { description: _d, ...noDescription } = good();
    expect(issues(noDescription)).toEqual([["description", "Description must be text."]]);
  });

  it("refuses an empty optional field rather than storing a blank", () => {
    expect(issues({ ...good(), batch: "  " })).toEqual([["batch", "batch number is empty: enter it, or leave it out"]]);
  });

  it("holds the length limits, counting after the trim", () => {
    expect(partFittedPayload.safeParse({ ...good(), partNumber: "P".repeat(60) }).success).toBe(true);
    expect(issues({ ...good(), partNumber: "P".repeat(61) })).toEqual([["partNumber", "Part number: at most 60 characters."]]);
    expect(issues({ ...good(), description: "d".repeat(201) })).toEqual([["description", "Description: at most 200 characters."]]);
    expect(issues({ ...good(), serial: "S".repeat(81) })).toEqual([["serial", "Serial number: at most 80 characters."]]);
    expect(issues({ ...good(), supplier: "s".repeat(121) })).toEqual([["supplier", "Supplier: at most 120 characters."]]);
    expect(partFittedPayload.safeParse({ ...good(), serial: ` ${"S".repeat(80)} ` }).success).toBe(true);
  });

  it("keeps each text on one line", () => {
    expect(issues({ ...good(), serial: "GS-0042\nGS-0043" })).toEqual([
      ["serial", "Serial number must be on one line (no line breaks or tabs)."],
    ]);
  });

  it("refuses ids that are not UUIDs and fields it does not know", () => {
    expect(issues({ ...good(), partFittedId: "piston-1" })).toEqual([["partFittedId", "must be a UUID"]]);
    const extra = partFittedPayload.safeParse({ ...good(), fittedBy: randomUUID() });
    expect(extra.error?.issues[0]).toMatchObject({ code: "unrecognized_keys", keys: ["fittedBy"] });
  });

  it("is one of the operation kinds, with the payload path in the issue", () => {
    const base = {
      id: randomUUID(),
      workOrderId: randomUUID(),
      authorId: randomUUID(),
      deviceId: "tab-1",
      deviceTime: "2026-12-02T09:30:00.000Z",
      stamp: formatStamp({ wallMs: 1_796_000_000_000, counter: 0, deviceId: "tab-1" }),
    };
    expect(operationSchema.parse({ ...base, kind: "part.fitted", payload: good() }).kind).toBe("part.fitted");
    const bad = operationSchema.safeParse({ ...base, kind: "part.fitted", payload: { ...good(), quantity: 0 } });
    expect(bad.error?.issues.map((i) => i.path.join("."))).toEqual(["payload.quantity"]);
  });
});

describe("comparing serial numbers", () => {
  it("ignores case, spaces and punctuation, but not the part number", () => {
    expect(serialKey("GS-PST-7600", "gs 0042")).toBe(serialKey("gs-pst-7600", "GS-0042"));
    expect(serialKey("GS-PST-7600", "GS-0042")).not.toBe(serialKey("GS-ROD-130", "GS-0042"));
    expect(serialKey("GS-PST-7600", "GS-0042")).not.toBe(serialKey("GS-PST-7600", "GS-0043"));
  });
});

describe("merging part.fitted", () => {
  const shopId = randomUUID();
  const mech: Actor = { id: randomUUID(), shopId, role: "mechanic" };
  const stepPistons = randomUUID();
  const stepRods = randomUUID();
  const NOW = Date.UTC(2026, 11, 2, 9, 0, 0);
  const job = (over: Partial<WorkOrderFacts> = {}): WorkOrderFacts => ({
    id: randomUUID(),
    shopId,
    number: 42,
    status: "in_build",
    assignedMechanicId: mech.id,
    steps: new Map([
      [stepPistons, { key: "fit-pistons", title: "Fit pistons to rods", jobProcedureId: randomUUID(), stageKey: "assemble" }],
      [stepRods, { key: "rod-bolts", title: "Torque rod bolts", jobProcedureId: randomUUID(), stageKey: "assemble" }],
    ]),
    measurementSpecs: new Map(),
    torqueSpecs: new Map(),
    timerSpecs: new Map(),
    sendBacks: [],
    ...over,
  });
  let counter = 0;
  const part = (j: WorkOrderFacts, payload: Partial<ReturnType<typeof good>> = {}): Operation => ({
    id: randomUUID(),
    kind: "part.fitted",
    workOrderId: j.id,
    authorId: mech.id,
    deviceId: "tab-1",
    deviceTime: new Date(NOW).toISOString(),
    stamp: formatStamp({ wallMs: NOW, counter: counter++, deviceId: "tab-1" }),
    payload: { ...good(), stepId: stepPistons, ...payload },
  });
  const input = (j: WorkOrderFacts, state = emptyMergeState(), actor = mech) => ({
    actor,
    batchDeviceId: "tab-1",
    cursor: 1,
    nowMs: NOW,
    job: j,
    state,
  });

  it("accepts a part at a step of the job, and refuses one at a step that is not", () => {
    const j = job();
    expect(decideOperation(part(j), input(j))).toEqual({ outcome: "accept" });
    const stranger = randomUUID();
    expect(decideOperation(part(j, { stepId: stranger }), input(j))).toEqual({
      outcome: "refuse",
      reason: `Step ${stranger} is not part of a procedure on work order #42.`,
    });
  });

  it("refuses a part record id already in use", () => {
    const j = job();
    const state = emptyMergeState();
    const first = part(j);
    noteAccepted(first, state);
    const reused = part(j, { partFittedId: first.kind === "part.fitted" ? first.payload.partFittedId : "", serial: "GS-0099" });
    expect(decideOperation(reused, input(j, state))).toEqual({
      outcome: "refuse",
      reason: expect.stringMatching(/^Part record .* is already on record\.$/),
    });
  });

  it("keeps a repeated serial of the same part on the job but flags it, saying where the first went", () => {
    const j = job();
    const state = emptyMergeState();
    noteAccepted(part(j, { serial: "GS-0042" }), state);
    expect(decideOperation(part(j, { serial: "gs 0042", stepId: stepRods }), input(j, state))).toEqual({
      outcome: "flag",
      reason:
        'Serial number gs 0042 of part GS-PST-7600 is already recorded on work order #42 at step "Fit pistons to rods": check the part was not recorded twice or fitted twice.',
    });
    // Another part number with the same serial, or a batch-only part, is not a repeat.
    expect(decideOperation(part(j, { serial: "GS-0042", partNumber: "GS-ROD-130" }), input(j, state)).outcome).toBe("accept");
    expect(decideOperation(part(j, { serial: undefined, batch: "L1", quantity: 3 }), input(j, state)).outcome).toBe("accept");
  });

  it("flags a repeat of a part the office recorded without a step, and only on the same job", () => {
    const j = job();
    const state = emptyMergeState();
    state.partSerials.set(partSerialOnWorkOrder(j.id, "GS-PST-7600", "GS-0042"), { stepId: null });
    expect(decideOperation(part(j), input(j, state))).toMatchObject({
      outcome: "flag",
      reason: expect.stringContaining("already recorded on work order #42: check"),
    });
    const other = job({ number: 43 });
    expect(decideOperation(part(other), input(other, state)).outcome).toBe("accept");
  });

  it("follows the bench rules for who may record it", () => {
    const j = job({ assignedMechanicId: randomUUID() });
    expect(decideOperation(part(j), input(j))).toEqual({ outcome: "refuse", reason: "Work order #42 is assigned to another mechanic." });
    const open = job({ assignedMechanicId: null });
    expect(decideOperation(part(open), input(open)).outcome).toBe("accept");
    const office: Actor = { ...mech, role: "office" };
    expect(decideOperation(part(open), input(open, emptyMergeState(), office))).toEqual({
      outcome: "refuse",
      reason: "Your role (office) may not record bench work.",
    });
  });
});
