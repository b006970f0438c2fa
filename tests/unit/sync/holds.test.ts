import { describe, expect, it } from "vitest";
import { holdAt, runningAt, type HoldTimer } from "@/lib/sync/holds";

const T0 = Date.UTC(2026, 11, 3, 9, 0);
const min = (m: number) => T0 + m * 60_000;
const timer = (id: string, startMin: number, over: Partial<HoldTimer> = {}): HoldTimer => ({
  id,
  startedAtMs: min(startMin),
  durationS: 1800,
  stoppedAtMs: null,
  cancelled: false,
  overrideAtMs: null,
  ...over,
});

describe("a timer holds the step it names until the wait is really over", () => {
  it("holds while the timer was never started, and while it runs; releases when its full time is up", () => {
    expect(holdAt([], min(0))).toMatchObject({ held: true, why: "not-started" });
    const t = timer("a", 0);
    expect(holdAt([t], min(-1))).toMatchObject({ held: true, why: "not-started" }); // not started yet at that moment
    expect(holdAt([t], min(29))).toMatchObject({ held: true, why: "running", endsAtMs: min(30) });
    expect(holdAt([t], min(30))).toMatchObject({ held: false });
  });

  it("a supervisor's override releases it from the moment it was made", () => {
    const t = timer("a", 0, { overrideAtMs: min(10) });
    expect(holdAt([t], min(9)).held).toBe(true);
    expect(holdAt([t], min(10)).held).toBe(false);
  });

  it("a timer stopped before its time never releases the step; a new full run or an override does", () => {
    const stopped = timer("a", 0, { stoppedAtMs: min(12) });
    expect(holdAt([stopped], min(45))).toMatchObject({ held: true, why: "stopped-early" });
    const again = timer("b", 20);
    expect(holdAt([stopped, again], min(45))).toMatchObject({ held: true, why: "running" });
    expect(holdAt([stopped, again], min(50)).held).toBe(false);
    // stopped after its time was up: it had run its full time
    expect(holdAt([timer("c", 0, { stoppedAtMs: min(31) })], min(31)).held).toBe(false);
  });

  it("two timers of one wait (two tablets offline): the later start decides, so the hold lasts until the later one is done", () => {
    const first = timer("a", 0);
    const second = timer("b", 5);
    expect(holdAt([first, second], min(32))).toMatchObject({ held: true, why: "running", endsAtMs: min(35) });
    expect(holdAt([second, first], min(35)).held).toBe(false);
  });

  it("a cancelled timer (started by mistake) does not count at all", () => {
    const real = timer("a", 0);
    const mistaken = timer("b", 5, { cancelled: true });
    expect(holdAt([real, mistaken], min(31)).held).toBe(false);
    expect(holdAt([mistaken], min(40))).toMatchObject({ held: true, why: "not-started" });
  });

  it("tells whether a timer was running at a moment", () => {
    const t = timer("a", 0, { stoppedAtMs: min(10) });
    expect(runningAt(t, min(5))).toBe(true);
    expect(runningAt(t, min(10))).toBe(false);
    expect(runningAt(timer("b", 0, { cancelled: true }), min(5))).toBe(false);
    expect(runningAt(timer("c", 0), min(30))).toBe(false);
  });
});
