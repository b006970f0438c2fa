import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  formatHundredthsAsHours,
  formatMinutes,
  hundredthsToMinutes,
  minutesToHundredths,
  quotedLabourHundredths,
  spanMinutes,
  summariseHours,
} from "@/lib/clock/hours";
import { clockSpans, openClockAt, type ClockRecord } from "@/lib/clock/spans";

const T0 = Date.parse("2026-12-03T08:00:00.000Z");
const min = (n: number) => n * 60_000;
const clock = (id: string, mechanicId: string, startMin: number, stage: string | null = null, workOrderId = "wo"): ClockRecord => ({
  id,
  mechanicId,
  workOrderId,
  jobProcedureId: stage ? "jp" : null,
  stageKey: stage,
  startedAtMs: T0 + min(startMin),
});

describe("minutes and hours (rounding: nearest minute per clock, half up; hundredths of an hour half up)", () => {
  it("rounds a span to the nearest whole minute, 30 s and more up", () => {
    expect(spanMinutes({ startedAtMs: 0, endedAtMs: 29_999 })).toBe(0);
    expect(spanMinutes({ startedAtMs: 0, endedAtMs: 30_000 })).toBe(1);
    expect(spanMinutes({ startedAtMs: 0, endedAtMs: min(90) + 29_000 })).toBe(90);
    expect(spanMinutes({ startedAtMs: 10, endedAtMs: 0 })).toBe(0);
  });
  it("turns minutes into hundredths of an hour and back (common practice: 6 min = 0.1 h)", () => {
    expect(minutesToHundredths(6)).toBe(10);
    expect(minutesToHundredths(60)).toBe(100);
    expect(minutesToHundredths(20)).toBe(33); // 33.33…
    expect(minutesToHundredths(40)).toBe(67); // 66.67…
    expect(minutesToHundredths(1)).toBe(2); // 1.67…
    expect(hundredthsToMinutes(1400)).toBe(840);
    expect(hundredthsToMinutes(25)).toBe(15);
    fc.assert(fc.property(fc.integer({ min: 0, max: 100_000 }), (h) => Math.abs(minutesToHundredths(hundredthsToMinutes(h)) - h) <= 1));
  });
  it("writes hours for people", () => {
    expect(formatMinutes(0)).toBe("0 min");
    expect(formatMinutes(45)).toBe("45 min");
    expect(formatMinutes(185)).toBe("3 h 05 min");
    expect(formatHundredthsAsHours(1400)).toBe("14.00 h");
    expect(formatHundredthsAsHours(5)).toBe("0.05 h");
    expect(formatHundredthsAsHours(-125)).toBe("−1.25 h");
  });
  it("sums the labour lines of a quote only", () => {
    expect(
      quotedLabourHundredths([
        { kind: "labour", quantityHundredths: 650 },
        { kind: "part", quantityHundredths: 400 },
        { kind: "labour", quantityHundredths: 125 },
      ]),
    ).toBe(775);
  });
});

describe("clock spans", () => {
  it("ends a clock at its clock-off, a supervisor's close or the next clock-on, whichever is first", () => {
    const clocks = [clock("a", "m1", 0), clock("b", "m1", 120), clock("c", "m2", 0)];
    const spans = clockSpans(
      clocks,
      [
        { clockId: "a", kind: "clocked-off", endedAtMs: T0 + min(200) }, // after b's clock-on: b ends it first
        { clockId: "c", kind: "closed-by-supervisor", endedAtMs: T0 + min(300) },
        { clockId: "c", kind: "clocked-off", endedAtMs: T0 + min(240) },
      ],
      T0 + min(400),
    );
    const by = Object.fromEntries(spans.map((s) => [s.id, s]));
    expect(by.a).toMatchObject({ endedAtMs: T0 + min(120), endedBy: "next-clock-on", running: false });
    expect(by.b).toMatchObject({ endedAtMs: T0 + min(400), endedBy: "running", running: true });
    expect(by.c).toMatchObject({ endedAtMs: T0 + min(240), endedBy: "clocked-off", running: false });
  });
  it("knows the clock open at a moment (one open clock per mechanic)", () => {
    const clocks = [clock("a", "m1", 0), clock("b", "m1", 120)];
    const ends = [{ clockId: "b", kind: "clocked-off" as const, endedAtMs: T0 + min(180) }];
    expect(openClockAt("m1", T0 + min(60), clocks, ends)?.id).toBe("a");
    expect(openClockAt("m1", T0 + min(150), clocks, ends)?.id).toBe("b");
    expect(openClockAt("m1", T0 + min(181), clocks, ends)).toBeNull();
    expect(openClockAt("m2", T0 + min(60), clocks, ends)).toBeNull();
  });
  it("never counts a mechanic twice: spans of one person never overlap, whatever order the records come in", () => {
    const rec = fc.record({
      m: fc.constantFrom("m1", "m2"),
      start: fc.integer({ min: 0, max: 600 }),
      off: fc.option(fc.integer({ min: 0, max: 300 })),
    });
    fc.assert(
      fc.property(fc.array(rec, { maxLength: 12 }), (rows) => {
        const clocks = rows.map((r, i) => clock(`c${String(i).padStart(2, "0")}`, r.m, r.start));
        const ends = rows.flatMap((r, i) =>
          r.off === null ? [] : [{ clockId: clocks[i].id, kind: "clocked-off" as const, endedAtMs: clocks[i].startedAtMs + min(r.off) }],
        );
        const a = clockSpans(clocks, ends, T0 + min(1000));
        const b = clockSpans([...clocks].reverse(), [...ends].reverse(), T0 + min(1000));
        expect(b).toEqual(a);
        for (const m of ["m1", "m2"]) {
          const mine = a.filter((s) => s.mechanicId === m);
          for (let i = 0; i + 1 < mine.length; i++) expect(mine[i].endedAtMs).toBeLessThanOrEqual(mine[i + 1].startedAtMs);
          expect(mine.filter((s) => s.running).length).toBeLessThanOrEqual(1);
        }
      }),
    );
  });
});

describe("hours per stage and per person against the quote", () => {
  it("adds up: stages and people each sum to the total, compared in hundredths of an hour", () => {
    const clocks = [clock("a", "m1", 0, "strip"), clock("b", "m2", 0, null), clock("c", "m1", 100, "build")];
    const ends = [
      { clockId: "a", kind: "clocked-off" as const, endedAtMs: T0 + min(90) + 40_000 }, // 90 min 40 s → 91
      { clockId: "b", kind: "clocked-off" as const, endedAtMs: T0 + min(45) },
      { clockId: "c", kind: "clocked-off" as const, endedAtMs: T0 + min(160) },
    ];
    const s = summariseHours(clockSpans(clocks, ends, T0 + min(500)), 200);
    expect(s.totalMinutes).toBe(91 + 45 + 60);
    expect(s.byStage.find((l) => l.key === "jp|strip")?.minutes).toBe(91);
    expect(s.byStage.find((l) => l.key === "")?.minutes).toBe(45);
    expect(s.byPerson.find((l) => l.key === "m1")?.minutes).toBe(151);
    expect(s.byStage.reduce((n, l) => n + l.minutes, 0)).toBe(s.totalMinutes);
    expect(s.byPerson.reduce((n, l) => n + l.minutes, 0)).toBe(s.totalMinutes);
    expect(s.overQuoteHundredths).toBe(minutesToHundredths(196) - 200); // 327 − 200
    expect(summariseHours([], null).overQuoteHundredths).toBeNull();
  });
});
