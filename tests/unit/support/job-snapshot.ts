import { formatStamp } from "@/lib/sync/hlc";
import type { Operation } from "@/lib/sync/operations";
import type { JobSnapshot } from "@/lib/sync/snapshot";

// A small job for the unit tests of the work-order record and the tablet's store: one procedure,
// stage "measure" (a reading spot pair) and stage "assemble" (two bolts in two passes, a cure
// timer on the sealant step that holds the case-bolt step). Invented figures.

export const u = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, "0")}`;
export const at = (min: number) => new Date(Date.UTC(2026, 11, 2, 8, 0) + min * 60_000).toISOString();
export const ids = {
  job: u(99),
  mech: u(1),
  supervisor: u(2),
  proc: u(10),
  stepBore: u(20),
  stepBolts: u(21),
  stepSealant: u(22),
  stepCase: u(23),
  boreSpec: u(30),
  rodSpec: u(31),
  cureSpec: u(32),
};

const step = (
  id: string,
  key: string,
  title: string,
  position: number,
  extra: Partial<JobSnapshot["procedures"][number]["stages"][number]["steps"][number]> = {},
) => ({
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
  ...extra,
});

export function jobSnapshot(state: Partial<JobSnapshot["state"]> = {}, cursor = "10"): JobSnapshot {
  return {
    workOrder: {
      id: ids.job,
      number: 1099,
      title: "Bottom end",
      complaint: "",
      status: "in_build",
      statusLabel: "In build",
      openForBenchWork: true,
      assignedMechanic: null,
      assignedToMe: true,
      mayWork: true,
    },
    bike: { id: u(98), make: "Marlin", model: "Sixty Sport", year: 2015, tagCode: "GSW-0099", colour: null, displacementCc: 636 },
    people: [],
    procedures: [
      {
        jobProcedureId: ids.proc,
        position: 0,
        templateVersionId: u(11),
        templateKey: "bottom-end",
        name: "Bottom end",
        version: 1,
        exampleOnly: true,
        stages: [
          {
            key: "measure",
            title: "Measure",
            position: 0,
            steps: [
              step(ids.stepBore, "bore", "Bore gauge", 0, {
                measurementSpecs: [
                  {
                    id: ids.boreSpec,
                    key: "bore-1",
                    label: "Bore",
                    nominal: 76,
                    min: 75.99,
                    max: 76.01,
                    unit: "mm",
                    readingLabels: ["Top", "Bottom"],
                    geometry: null,
                  },
                ],
              }),
            ],
          },
          {
            key: "assemble",
            title: "Assemble",
            position: 1,
            steps: [
              step(ids.stepBolts, "rod-bolts", "Rod bolts", 0, {
                torqueSpecs: [
                  {
                    id: ids.rodSpec,
                    label: "Rod cap bolts",
                    finalValue: 40,
                    unit: "N·m",
                    passes: [{ percent: 50 }, { percent: 100 }],
                    anglePasses: [],
                    pattern: "linear",
                    boltCount: 2,
                    lubricant: "",
                    torqueToYield: false,
                  },
                ],
              }),
              step(ids.stepSealant, "sealant", "Case sealant", 1, {
                timerSpecs: [{ id: ids.cureSpec, label: "Sealant cure", durationS: 1800, blocksStepKey: "case-bolts" }],
              }),
              step(ids.stepCase, "case-bolts", "Case bolts", 2),
            ],
          },
        ],
      },
    ],
    state: {
      completions: [],
      readings: [],
      torqueRecords: [],
      timers: [],
      signOffs: [],
      reviewDecisions: [],
      photos: [],
      parts: [],
      ...state,
    },
    cursor,
  };
}

let n = 0;
/** An operation of this tablet (device "tab-1") on the job, stamped at `min` minutes. */
export function tabletOp<K extends Operation["kind"]>(
  kind: K,
  payload: Extract<Operation, { kind: K }>["payload"],
  min = 30,
  id = u(500 + ++n),
): Operation {
  return {
    id,
    kind,
    workOrderId: ids.job,
    authorId: ids.mech,
    deviceId: "tab-1",
    deviceTime: at(min),
    stamp: formatStamp({ wallMs: Date.parse(at(min)), counter: n, deviceId: "tab-1" }),
    payload,
  } as Operation;
}

export const completion = (id: string, stepId: string, seq: string, flagReason: string | null = null) => ({
  id,
  stepId,
  completedBy: ids.mech,
  deviceTime: at(5),
  receivedAt: at(6),
  flagged: flagReason !== null,
  flagReason,
  seq,
});
export const signOff = (id: string, stageKey: string, seq: string) => ({
  id,
  jobProcedureId: ids.proc,
  stageKey,
  signedBy: ids.mech,
  deviceTime: at(8),
  receivedAt: at(9),
  seq,
});
export const decision = (
  id: string,
  stageKey: string,
  verdict: "approved" | "sent_back",
  seq: string,
  reopenedStepIds: string[] = [],
  reason = "",
) => ({
  id,
  signOffId: u(700),
  jobProcedureId: ids.proc,
  stageKey,
  decision: verdict,
  reason,
  reopenedStepIds,
  decidedBy: ids.supervisor,
  decidedAt: at(12),
  seq,
});
export const torqueRecord = (id: string, passIndex: number, bolt: number) => ({
  id,
  stepId: ids.stepBolts,
  torqueSpecId: ids.rodSpec,
  passIndex,
  bolt,
  wrenchReading: null,
  wrenchUnit: null,
  recordedBy: ids.mech,
  deviceTime: at(20),
});
