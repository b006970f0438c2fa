import { describe, expect, it } from "vitest";
import { buildJobView, stepWithSerial } from "@/lib/bench/job-view";
import { formatStamp } from "@/lib/sync/hlc";
import type { Operation } from "@/lib/sync/operations";
import type { JobSnapshot } from "@/lib/sync/snapshot";

// The bench's view of parts fitted: those on record and this tablet's waiting ones, each at its step.

const u = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, "0")}`;
const JOB = u(99),
  MECH = u(1),
  OFFICE = u(2),
  STEP_A = u(20),
  STEP_B = u(21);
const at = (min: number) => new Date(Date.UTC(2026, 11, 2, 8, min)).toISOString();

function snapshot(parts: JobSnapshot["state"]["parts"]): JobSnapshot {
  const step = (id: string, key: string, title: string, position: number) => ({
    id,
    key,
    title,
    position,
    instructions: "",
    cautions: [],
    requiresPhoto: false,
    waitsForStepKey: null,
    torqueSpecs: [],
    measurementSpecs: [],
    timerSpecs: [],
  });
  return {
    workOrder: {
      id: JOB,
      number: 7,
      title: "Rebuild",
      complaint: "",
      status: "in_build",
      statusLabel: "In build",
      openForBenchWork: true,
      assignedMechanic: null,
      assignedToMe: false,
      mayWork: true,
    },
    bike: { id: u(98), make: "Marlin", model: "Sixty Sport", year: 2015, tagCode: "GSW-0004", colour: null, displacementCc: 636 },
    people: [],
    procedures: [
      {
        jobProcedureId: u(10),
        position: 0,
        templateVersionId: u(11),
        templateKey: "t",
        name: "Bottom end",
        version: 1,
        exampleOnly: false,
        stages: [
          {
            key: "assemble",
            title: "Assemble",
            position: 0,
            steps: [step(STEP_A, "pistons", "Fit pistons", 0), step(STEP_B, "rods", "Fit rods", 1)],
          },
        ],
      },
    ],
    state: { completions: [], readings: [], torqueRecords: [], timers: [], signOffs: [], reviewDecisions: [], photos: [], parts },
    cursor: "9",
  };
}

const onRecord = (id: number, stepId: string | null, serial: string | null, flagReason: string | null = null) => ({
  id: u(id),
  stepId,
  partNumber: "GS-PST-7600",
  description: "Forged piston",
  supplier: "",
  serial,
  batch: null,
  quantity: 1,
  fittedBy: stepId ? MECH : OFFICE,
  fittedAt: at(id % 60),
  flagged: flagReason !== null,
  flagReason,
});

const waiting: Operation = {
  id: u(500),
  kind: "part.fitted",
  workOrderId: JOB,
  authorId: MECH,
  deviceId: "tab-1",
  deviceTime: at(30),
  stamp: formatStamp({ wallMs: Date.parse(at(30)), counter: 0, deviceId: "tab-1" }),
  payload: { partFittedId: u(501), stepId: STEP_B, partNumber: "GS-ROD-130", description: "H-beam rod", batch: "L24-7", quantity: 2 },
};

describe("parts fitted in the bench view", () => {
  it("puts each part at its step, waiting ones after those on record, and leaves out parts with no step", () => {
    const view = buildJobView(
      snapshot([
        onRecord(101, STEP_A, "GS-0042"),
        onRecord(102, null, "GS-0050"),
        onRecord(103, STEP_B, "GS-0043", "Serial number GS-0043 … twice."),
      ]),
      [waiting],
      Date.parse(at(40)),
    );
    const [a, b] = view.steps;
    expect(a.parts.map((p) => [p.id, p.serial, p.pending])).toEqual([[u(101), "GS-0042", false]]);
    expect(b.parts.map((p) => [p.id, p.partNumber, p.batch, p.quantity, p.pending, p.flagReason])).toEqual([
      [u(103), "GS-PST-7600", null, 1, false, "Serial number GS-0043 … twice."],
      [u(501), "GS-ROD-130", "L24-7", 2, true, null],
    ]);
    expect(b.parts[1]).toMatchObject({ fittedBy: MECH, fittedAt: at(30), supplier: "", serial: null });
  });

  it("reads a snapshot stored before parts were in it as having none", () => {
    const old = snapshot([]);
    delete (old.state as Partial<JobSnapshot["state"]>).parts;
    expect(buildJobView(old, [waiting], 0).steps.map((s) => s.parts.length)).toEqual([0, 1]);
  });

  it("finds the step where a serial number is already recorded, however it is written", () => {
    const view = buildJobView(snapshot([onRecord(101, STEP_A, "GS-0042")]), [], 0);
    expect(stepWithSerial(view, "gs-pst-7600", "gs 0042")?.step.id).toBe(STEP_A);
    expect(stepWithSerial(view, "GS-PST-7600", "GS-0044")).toBeNull();
    expect(stepWithSerial(view, "GS-ROD-130", "GS-0042")).toBeNull();
  });
});
