import { describe, expect, it } from "vitest";
import { formatStamp } from "@/lib/sync/hlc";
import type { JobSnapshot } from "@/lib/sync/snapshot";
import { buildStageReview, type ReviewExtras } from "@/lib/review/stage-review";

const u = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, "0")}`;
const MECH = u(1),
  MECH2 = u(2),
  SUP = u(3),
  JP = u(10),
  STEP_A = u(20),
  STEP_B = u(21),
  SPEC = u(30),
  TQ = u(31),
  SO = u(40);
const at = (min: number) => new Date(Date.UTC(2026, 11, 2, 8, min)).toISOString();
const stamp = (min: number, device: string) => formatStamp({ wallMs: Date.parse(at(min)), counter: 0, deviceId: device });

function reading(
  id: number,
  index: number,
  value: number,
  verdict: "in" | "low" | "high",
  min: number,
  device: string,
  by = MECH,
  supersedesId: string | null = null,
) {
  return {
    id: u(id),
    stepId: STEP_A,
    specId: SPEC,
    readingIndex: index,
    value,
    unit: "mm" as const,
    verdict,
    note: "",
    supersedesId,
    current: false,
    recordedBy: by,
    deviceId: device,
    deviceTime: at(min),
    stamp: stamp(min, device),
    flagged: false,
    flagReason: null,
  };
}

function snapshot(readings: JobSnapshot["state"]["readings"]): JobSnapshot {
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
  return {
    workOrder: {
      id: u(99),
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
        jobProcedureId: JP,
        position: 0,
        templateVersionId: u(11),
        templateKey: "t",
        name: "Bottom end",
        version: 1,
        exampleOnly: true,
        stages: [
          {
            key: "measure",
            title: "Measure",
            position: 0,
            steps: [
              step(STEP_A, "ring-gap", "Top ring end gap", 0, {
                measurementSpecs: [
                  {
                    id: SPEC,
                    key: "gap",
                    label: "Top ring gap",
                    nominal: 0.4,
                    min: 0.35,
                    max: 0.48,
                    unit: "mm",
                    readingLabels: ["Cyl 1", "Cyl 2"],
                    geometry: null,
                  },
                ],
              }),
              step(STEP_B, "rods", "Rod bolts", 1, {
                torqueSpecs: [
                  {
                    id: TQ,
                    label: "Rod cap bolts",
                    finalValue: 20,
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
            ],
          },
        ],
      },
    ],
    state: {
      completions: [
        {
          id: u(50),
          stepId: STEP_A,
          completedBy: MECH,
          deviceTime: at(20),
          receivedAt: at(45),
          flagged: false,
          flagReason: null,
          seq: "5",
        },
      ],
      readings,
      torqueRecords: [1, 2].map((bolt) => ({
        id: u(60 + bolt),
        stepId: STEP_B,
        torqueSpecId: TQ,
        passIndex: 1,
        bolt,
        wrenchReading: null,
        wrenchUnit: null,
        recordedBy: MECH,
        deviceTime: at(30 + bolt),
      })),
      timers: [],
      signOffs: [],
      reviewDecisions: [],
      photos: [],
      parts: [],
    },
    cursor: "9",
  };
}

const extras = (over: Partial<ReviewExtras> = {}): ReviewExtras => ({
  receipts: new Map([[u(1001), { receivedAt: at(50), deviceId: "tab-a" }]]),
  names: new Map([
    [MECH, "Tomas Reyes"],
    [MECH2, "Priya Vance"],
    [SUP, "Dana Kowal"],
  ]),
  acceptances: [],
  signOffs: [
    {
      id: SO,
      jobProcedureId: JP,
      stageKey: "measure",
      signedBy: MECH,
      deviceTime: at(40),
      receivedAt: at(50),
      deviceId: "tab-a",
      seq: "8",
      flagged: false,
      flagReason: null,
    },
  ],
  decisions: [],
  ...over,
});

describe("buildStageReview", () => {
  it("shows two tablets' readings of one spot side by side, the later stamp current; a correction replaces only its own", () => {
    const readings = [
      reading(1001, 0, 0.41, "in", 5, "tab-a"),
      reading(1002, 1, 0.5, "high", 6, "tab-a"),
      reading(1003, 1, 0.44, "in", 9, "tab-b", MECH2),
      reading(1004, 0, 0.42, "in", 7, "tab-a", MECH, u(1001)),
    ];
    const r = buildStageReview(snapshot(readings), extras(), SO)!;
    const [cyl1, cyl2] = r.steps[0].specs[0].spots;
    expect(cyl1.history.map((h) => [h.value, h.current, h.supersededBy])).toEqual([
      // shown as the decimal text (a value from an older tablet, with no text, as it prints)
      ["0.41", false, u(1004)],
      ["0.42", true, null],
    ]);
    expect(cyl1.history[0].receivedAt).toBe(at(50));
    expect(cyl1.rivals).toEqual([]);
    expect(cyl2.rivals.map((x) => [x.deviceId, x.by.name, x.value, x.current])).toEqual([
      ["tab-a", "Tomas Reyes", "0.5", false],
      ["tab-b", "Priya Vance", "0.44", true],
    ]);
    // The later stamp counts, so the high reading is not the current one: nothing is out of tolerance.
    expect(r.outOfTolerance).toEqual([]);
    expect(r.defaultReopenStepIds).toEqual([STEP_A, STEP_B]);
  });

  it("lists current readings out of tolerance, with any acceptance, and reopens their steps by default", () => {
    const r = buildStageReview(snapshot([reading(1002, 1, 0.5, "high", 6, "tab-a")]), extras(), SO)!;
    expect(r.outOfTolerance).toEqual([
      expect.objectContaining({
        readingId: u(1002),
        stepId: STEP_A,
        readingLabel: "Cyl 2",
        verdict: "high",
        min: 0.35,
        max: 0.48,
        acceptance: null,
      }),
    ]);
    expect(r.defaultReopenStepIds).toEqual([STEP_A]);
    expect(r.steps[0].specs[0].spots[0]).toMatchObject({ label: "Cyl 1", current: null, history: [] });

    const accepted = buildStageReview(
      snapshot([reading(1002, 1, 0.5, "high", 6, "tab-a")]),
      extras({
        acceptances: [{ measurementId: u(1002), decisionId: u(70), justification: "Maker allows it", acceptedBy: SUP, acceptedAt: at(55) }],
      }),
      SO,
    )!;
    expect(accepted.outOfTolerance[0].acceptance).toEqual({
      decisionId: u(70),
      justification: "Maker allows it",
      acceptedAt: at(55),
      by: { id: SUP, name: "Dana Kowal" },
    });
    expect(accepted.defaultReopenStepIds).toEqual([STEP_A, STEP_B]);
  });

  it("shows torque bolt by bolt per pass, and who signed off, and the earlier sign-offs with their decisions", () => {
    const earlier = {
      id: u(41),
      jobProcedureId: JP,
      stageKey: "measure",
      signedBy: MECH,
      deviceTime: at(10),
      receivedAt: at(11),
      deviceId: "tab-a",
      seq: "3",
      flagged: false,
      flagReason: null,
    };
    const back = {
      id: u(80),
      signOffId: u(41),
      decision: "sent_back" as const,
      reason: "Redo the gaps",
      reopenedStepIds: [STEP_A],
      decidedBy: SUP,
      decidedAt: at(12),
      seq: "4",
    };
    const r = buildStageReview(snapshot([]), extras({ signOffs: [earlier, ...extras().signOffs], decisions: [back] }), SO)!;
    const t = r.steps[1].torque[0];
    expect(t.passes.map((p) => [p.label, p.bolts.map((b) => Boolean(b.done))])).toEqual([
      ["10 N·m (50 %)", [true, true]],
      ["20 N·m (100 %)", [false, false]],
    ]);
    expect(t.complete).toBe(false);
    expect(r.signOff).toMatchObject({ by: { name: "Tomas Reyes" }, isLatest: true, deviceId: "tab-a" });
    expect(r.earlier).toEqual([
      expect.objectContaining({
        id: u(41),
        decisions: [{ decision: "sent_back", reason: "Redo the gaps", decidedAt: at(12), by: { id: SUP, name: "Dana Kowal" } }],
      }),
    ]);
    expect(r.steps[0].sentBack).toEqual([{ reason: "Redo the gaps", decidedAt: at(12), by: { id: SUP, name: "Dana Kowal" } }]);
    expect(r.steps[0].completions[0]).toMatchObject({ by: { name: "Tomas Reyes" }, deviceTime: at(20), receivedAt: at(45) });
    expect(buildStageReview(snapshot([]), extras(), u(41))).toBeNull();
  });

  it("lists the parts fitted at each step with who fitted them and the sync's flag", () => {
    const snap = snapshot([]);
    const part = {
      partNumber: "GS-ROD-130",
      description: "H-beam rod",
      supplier: "",
      serial: "GR-7",
      batch: null,
      quantity: 1,
      fittedAt: at(25),
    };
    snap.state.parts = [
      { ...part, id: u(80), stepId: STEP_B, fittedBy: MECH, flagged: false, flagReason: null },
      {
        ...part,
        id: u(81),
        stepId: STEP_B,
        fittedBy: MECH2,
        flagged: true,
        flagReason: "Serial number GR-7 of part GS-ROD-130 is already recorded on work order #7.",
      },
      { ...part, id: u(82), stepId: null, fittedBy: u(4), flagged: false, flagReason: null },
    ];
    const r = buildStageReview(snap, extras(), SO)!;
    expect(r.steps[0].parts).toEqual([]);
    expect(r.steps[1].parts).toEqual([
      { ...part, id: u(80), by: { id: MECH, name: "Tomas Reyes" }, flagReason: null, withdrawn: null },
      {
        ...part,
        id: u(81),
        by: { id: MECH2, name: "Priya Vance" },
        flagReason: "Serial number GR-7 of part GS-ROD-130 is already recorded on work order #7.",
        withdrawn: null,
      },
    ]);
  });
});
