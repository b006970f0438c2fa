import { describe, expect, it } from "vitest";
import { decisionInputSchema, decisionRequestSchema } from "@/lib/review/decision-input";
import { checkDecision, type DecisionFacts } from "@/lib/review/decision-rules";

const ids = {
  sup: "00000000-0000-4000-8000-000000000001",
  mech: "00000000-0000-4000-8000-000000000002",
  mech2: "00000000-0000-4000-8000-000000000003",
  so: "00000000-0000-4000-8000-0000000000a1",
  s1: "00000000-0000-4000-8000-0000000000b1",
  s2: "00000000-0000-4000-8000-0000000000b2",
  r1: "00000000-0000-4000-8000-0000000000c1",
  d1: "00000000-0000-4000-8000-0000000000d1",
};

const facts = (over: Partial<DecisionFacts> = {}): DecisionFacts => ({
  actor: { id: ids.sup, role: "supervisor" },
  signOff: { id: ids.so, signedBy: ids.mech, stageTitle: "Measure before assembly" },
  job: { number: 1006, closed: false },
  latestSignOffId: ids.so,
  latestDecisionId: null,
  stageSteps: [
    { id: ids.s1, title: "Bore" },
    { id: ids.s2, title: "Ring gap" },
  ],
  outOfTolerance: [{ readingId: ids.r1, description: "Top ring gap, Cyl 2: 0.5 mm (high)", accepted: false }],
  flagged: [],
  ...over,
});
const input = (v: unknown) => decisionInputSchema.parse(v);
const approve = (acceptances: unknown[] = [], expectedDecisionId: string | null = null) =>
  input({ decision: "approved", expectedDecisionId, acceptances });
const sendBack = (reopenStepIds: string[]) =>
  input({ decision: "sent_back", expectedDecisionId: null, reason: "Regap cylinder 2", reopenStepIds });
const why = "Ring maker allows 0.50 mm for this bore size";

describe("checkDecision", () => {
  it("refuses roles that may not decide, and the one who signed off — whatever their role", () => {
    expect(checkDecision(facts({ actor: { id: ids.sup, role: "mechanic" } }), approve())).toMatchObject({ ok: false, status: 403 });
    expect(
      checkDecision(facts({ actor: { id: ids.mech, role: "supervisor" } }), approve([{ readingId: ids.r1, justification: why }])),
    ).toMatchObject({ ok: false, status: 403, reason: expect.stringMatching(/yourself/) });
    expect(
      checkDecision(facts({ actor: { id: ids.mech, role: "office" } }), approve([{ readingId: ids.r1, justification: why }])),
    ).toMatchObject({ ok: false, status: 403 });
  });

  it("decides only on the newest sign-off of the stage, and only knowing the standing decision", () => {
    expect(checkDecision(facts({ latestSignOffId: ids.s1 }), sendBack([ids.s2]))).toMatchObject({
      ok: false,
      status: 409,
      reason: expect.stringMatching(/signed off again/),
    });
    expect(checkDecision(facts({ latestDecisionId: ids.d1 }), sendBack([ids.s2]))).toMatchObject({ ok: false, status: 409 });
    expect(checkDecision(facts({ latestDecisionId: ids.d1 }), approve([{ readingId: ids.r1, justification: why }], ids.d1))).toEqual({
      ok: true,
      reopenStepIds: [],
    });
  });

  it("decides only on the record the screen showed: work on the stage that arrived since refuses approving and sending back alike", () => {
    const unseen = ["Reading: 0.43 mm (a correction)", "Step done", "Photo", "Torque bolt 3"];
    const both = [approve([{ readingId: ids.r1, justification: why }]), sendBack([ids.s2])];
    for (const decision of both) {
      expect(checkDecision(facts({ arrivedSinceSeen: unseen.slice(0, 1) }), decision)).toEqual({
        ok: false,
        status: 409,
        reason:
          'While you had this review open, 1 new entry (Reading: 0.43 mm (a correction)) arrived on "Measure before assembly". Reload to see it before you decide.',
        issues: [
          {
            path: "seenUpTo",
            message:
              'While you had this review open, 1 new entry (Reading: 0.43 mm (a correction)) arrived on "Measure before assembly". Reload to see it before you decide.',
          },
        ],
      });
      expect(checkDecision(facts({ arrivedSinceSeen: unseen }), decision)).toMatchObject({
        status: 409,
        reason: expect.stringContaining("4 new entries (Reading: 0.43 mm (a correction); Step done; Photo; …) arrived"),
      });
      expect(checkDecision(facts({ arrivedSinceSeen: [] }), decision)).toMatchObject({ ok: true });
    }
  });

  it("nobody lets their own work stand: a reading or a flagged entry the deciding supervisor recorded needs another's acceptance", () => {
    const mine = facts({
      outOfTolerance: [{ readingId: ids.r1, description: "Top ring gap, Cyl 2: 0.5 mm (high)", accepted: false, recordedBy: ids.sup }],
      flagged: [{ operationId: ids.d1, description: "Torque bolt: pass 1, bolt 3", accepted: false, authorId: ids.sup }],
    });
    const r = checkDecision(
      mine,
      input({
        decision: "approved",
        expectedDecisionId: null,
        acceptances: [{ readingId: ids.r1, justification: why }],
        flagAcceptances: [{ operationId: ids.d1, justification: "Bolt re-torqued with the second wrench" }],
      }),
    );
    expect(r).toMatchObject({ ok: false, status: 422 });
    expect(r.ok ? [] : r.issues).toEqual([
      {
        path: "acceptances.0.readingId",
        message: "You recorded Top ring gap, Cyl 2: 0.5 mm (high) yourself: another supervisor or the office must let it stand.",
      },
      {
        path: "flagAcceptances.0.operationId",
        message: "You recorded Torque bolt: pass 1, bolt 3 yourself: another supervisor or the office must accept it.",
      },
    ]);
    // another supervisor may; and sending the step back stays open to the one who recorded it
    expect(
      checkDecision(
        { ...mine, actor: { id: ids.mech2, role: "supervisor" } },
        input({
          decision: "approved",
          expectedDecisionId: null,
          acceptances: [{ readingId: ids.r1, justification: why }],
          flagAcceptances: [{ operationId: ids.d1, justification: "Bolt re-torqued with the second wrench" }],
        }),
      ),
    ).toEqual({ ok: true, reopenStepIds: [] });
    expect(checkDecision(mine, sendBack([ids.s2]))).toEqual({ ok: true, reopenStepIds: [ids.s2] });
  });

  it("approves only when every reading out of tolerance is let stand with a reason", () => {
    const r = checkDecision(facts(), approve());
    expect(r).toEqual({
      ok: false,
      status: 422,
      reason: "Top ring gap, Cyl 2: 0.5 mm (high) is out of tolerance: accept it with a written reason, or send the step back.",
      issues: [{ path: `reading.${ids.r1}`, message: expect.any(String) }],
    });
    expect(checkDecision(facts(), approve([{ readingId: ids.r1, justification: why }]))).toEqual({ ok: true, reopenStepIds: [] });
    expect(checkDecision(facts({ outOfTolerance: [{ readingId: ids.r1, description: "x", accepted: true }] }), approve())).toEqual({
      ok: true,
      reopenStepIds: [],
    });
  });

  it("refuses acceptances of readings that are not open out-of-tolerance readings of the stage", () => {
    const other = "00000000-0000-4000-8000-0000000000c9";
    expect(
      checkDecision(
        facts(),
        approve([
          { readingId: ids.r1, justification: why },
          { readingId: other, justification: why },
        ]),
      ),
    ).toMatchObject({ ok: false, status: 422, issues: [{ path: "acceptances.1.readingId" }] });
    expect(
      checkDecision(
        facts({ outOfTolerance: [{ readingId: ids.r1, description: "x", accepted: true }] }),
        approve([{ readingId: ids.r1, justification: why }]),
      ),
    ).toMatchObject({ ok: false, issues: [{ message: "x was already accepted." }] });
    expect(
      checkDecision(
        facts(),
        approve([
          { readingId: ids.r1, justification: why },
          { readingId: ids.r1, justification: why },
        ]),
      ),
    ).toMatchObject({ ok: false, issues: [{ path: "acceptances.1.readingId" }] });
  });

  it("sends back only steps of the stage, each once; not on a closed job", () => {
    expect(checkDecision(facts(), sendBack([ids.s2, ids.s2]))).toEqual({ ok: true, reopenStepIds: [ids.s2] });
    expect(checkDecision(facts(), sendBack([ids.r1]))).toMatchObject({ ok: false, status: 422, issues: [{ path: "reopenStepIds.0" }] });
    expect(checkDecision(facts({ job: { number: 1005, closed: true } }), sendBack([ids.s1]))).toMatchObject({
      ok: false,
      status: 409,
      reason: "Work order #1005 is closed: nothing on it can be reopened.",
    });
  });
});

describe("flagged entries of the stage (any kind the sync flagged)", () => {
  const op1 = "00000000-0000-4000-8000-0000000000e1";
  const op2 = "00000000-0000-4000-8000-0000000000e2";
  const flaggedFacts = facts({
    outOfTolerance: [],
    flagged: [
      { operationId: op1, description: "Step done at “Bore”", accepted: false },
      { operationId: op2, description: "Reading: 76.02 mm", accepted: true },
    ],
  });
  const approveWith = (flagAcceptances: unknown[]) => input({ decision: "approved", expectedDecisionId: null, flagAcceptances });

  it("approves only with a written acceptance of every flagged entry not yet accepted", () => {
    expect(checkDecision(flaggedFacts, approveWith([]))).toMatchObject({
      ok: false,
      status: 422,
      issues: [
        { path: `flagged.${op1}`, message: "Step done at “Bore” was flagged: accept it with a written reason, or send the step back." },
      ],
    });
    expect(checkDecision(flaggedFacts, approveWith([{ operationId: op1, justification: why }]))).toEqual({ ok: true, reopenStepIds: [] });
  });

  it("refuses an entry already accepted, one listed twice, and one not of the stage", () => {
    const other = "00000000-0000-4000-8000-0000000000e9";
    expect(
      checkDecision(
        flaggedFacts,
        approveWith([
          { operationId: op1, justification: why },
          { operationId: op2, justification: why },
        ]),
      ),
    ).toMatchObject({
      ok: false,
      issues: [{ path: "flagAcceptances.1.operationId", message: "Reading: 76.02 mm was already accepted." }],
    });
    expect(
      checkDecision(
        flaggedFacts,
        approveWith([
          { operationId: op1, justification: why },
          { operationId: op1, justification: why },
        ]),
      ),
    ).toMatchObject({ ok: false, issues: [{ path: "flagAcceptances.1.operationId" }] });
    expect(
      checkDecision(
        flaggedFacts,
        approveWith([
          { operationId: op1, justification: why },
          { operationId: other, justification: why },
        ]),
      ),
    ).toMatchObject({
      ok: false,
      issues: [{ path: "flagAcceptances.1.operationId", message: "This is not a flagged entry of this stage." }],
    });
  });

  it("asks for a written reason in workshop words", () => {
    expect(
      decisionInputSchema.safeParse({
        decision: "approved",
        expectedDecisionId: null,
        flagAcceptances: [{ operationId: op1, justification: "ok" }],
      }).error?.issues[0].message,
    ).toBe("Write at least 10 characters: why may this flagged entry stand?");
  });
});

describe("decisionRequestSchema (what the decision route takes)", () => {
  it("requires the record the screen showed, in words a supervisor acts on", () => {
    expect(decisionRequestSchema.safeParse({ decision: "approved", expectedDecisionId: null }).error?.issues).toEqual([
      expect.objectContaining({
        path: ["seenUpTo"],
        message: "Reload the review and decide again: this decision does not say which record you saw.",
      }),
    ]);
    expect(
      decisionRequestSchema.safeParse({ decision: "approved", expectedDecisionId: null, seenUpTo: "-1" }).error?.issues[0],
    ).toMatchObject({
      path: ["seenUpTo"],
      message: "Reload the review and decide again: this decision does not say which record you saw.",
    });
    expect(decisionRequestSchema.parse({ decision: "approved", expectedDecisionId: null, seenUpTo: "4812" })).toMatchObject({
      seenUpTo: "4812",
    });
  });
});

describe("decisionInputSchema", () => {
  it("names the field and the problem", () => {
    const r = decisionInputSchema.safeParse({ decision: "sent_back", expectedDecisionId: "nope", reason: "no", reopenStepIds: [] });
    expect(r.error?.issues.map((i) => [i.path.join("."), i.message])).toEqual([
      ["expectedDecisionId", "not a decision id"],
      ["reason", "Say why it goes back (at least 5 characters); the mechanic sees this on the step."],
      ["reopenStepIds", "Choose at least one step to reopen."],
    ]);
    expect(
      decisionInputSchema.safeParse({
        decision: "approved",
        expectedDecisionId: null,
        acceptances: [{ readingId: ids.r1, justification: "   fine    " }],
      }).error?.issues[0].message,
    ).toBe("Write at least 10 characters: why may this reading stand?");
  });
});
