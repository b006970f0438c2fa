import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  ClockDriftError,
  compareStamps,
  createClock,
  formatStamp,
  MAX_COUNTER,
  parseStamp,
  receive,
  StampError,
  tick,
  type HlcState,
} from "@/lib/sync/hlc";

describe("stamp format", () => {
  it("writes wall ms in 15 digits, the counter in 6, then the device", () => {
    expect(formatStamp({ wallMs: 1_796_000_000_123, counter: 7, deviceId: "bay-2.tablet" })).toBe("001796000000123-000007-bay-2.tablet");
  });

  it("reads back what it writes, device ids with dashes included", () => {
    const parts = { wallMs: 42, counter: 999_999, deviceId: "a-b-c" };
    expect(parseStamp(formatStamp(parts))).toEqual(parts);
  });

  it("refuses malformed stamps and device ids", () => {
    expect(() => parseStamp("12-3-x")).toThrow(StampError);
    expect(() => parseStamp("001796000000123-000007-")).toThrow(StampError);
    expect(() => createClock("has space")).toThrow(/device id/);
    expect(() => createClock("")).toThrow(StampError);
  });

  it("sorts as strings in the same order as (wall, counter, device)", () => {
    const parts = fc.record({
      wallMs: fc.integer({ min: 0, max: 4_102_444_800_000 }),
      counter: fc.integer({ min: 0, max: MAX_COUNTER }),
      deviceId: fc.constantFrom("a", "b", "tab-1", "tab-10", "tab-2"),
    });
    fc.assert(
      fc.property(parts, parts, (a, b) => {
        const tuple = a.wallMs - b.wallMs || a.counter - b.counter || (a.deviceId < b.deviceId ? -1 : a.deviceId > b.deviceId ? 1 : 0);
        expect(compareStamps(formatStamp(a), formatStamp(b))).toBe(Math.sign(tuple));
      }),
    );
  });
});

describe("tick", () => {
  it("takes the wall time when it moves on, and counts within one millisecond", () => {
    let c = createClock("t1");
    let r = tick(c, 1000);
    expect(parseStamp(r.stamp)).toEqual({ wallMs: 1000, counter: 0, deviceId: "t1" });
    c = r.state;
    r = tick(c, 1000);
    expect(parseStamp(r.stamp)).toEqual({ wallMs: 1000, counter: 1, deviceId: "t1" });
    r = tick(r.state, 1005);
    expect(parseStamp(r.stamp)).toEqual({ wallMs: 1005, counter: 0, deviceId: "t1" });
  });

  it("stays monotonic when the wall clock is set back", () => {
    let c = createClock("t1");
    const stamps: string[] = [];
    for (const now of [5000, 5001, 1000, 999, 5001, 4000, 6000]) {
      const r = tick(c, now);
      c = r.state;
      stamps.push(r.stamp);
    }
    for (let i = 1; i < stamps.length; i++) expect(compareStamps(stamps[i - 1], stamps[i])).toBe(-1);
    // while the wall was behind, the clock kept its highest wall time and counted on
    expect(parseStamp(stamps[3])).toEqual({ wallMs: 5001, counter: 2, deviceId: "t1" });
  });

  it("moves on one millisecond when the counter is full", () => {
    const full: HlcState = { wallMs: 2000, counter: MAX_COUNTER, deviceId: "t1" };
    expect(parseStamp(tick(full, 1500).stamp)).toEqual({ wallMs: 2001, counter: 0, deviceId: "t1" });
  });

  it("is strictly increasing for any sequence of wall times and received stamps", () => {
    const step = fc.oneof(
      fc.record({ type: fc.constant("local" as const), now: fc.integer({ min: 0, max: 10_000 }) }),
      fc.record({
        type: fc.constant("remote" as const),
        now: fc.integer({ min: 0, max: 10_000 }),
        wall: fc.integer({ min: 0, max: 12_000 }),
        counter: fc.integer({ min: 0, max: 50 }),
      }),
    );
    fc.assert(
      fc.property(fc.array(step, { minLength: 1, maxLength: 60 }), (steps) => {
        let c = createClock("dev-a");
        let last = "";
        for (const s of steps) {
          const r =
            s.type === "local" ? tick(c, s.now) : receive(c, formatStamp({ wallMs: s.wall, counter: s.counter, deviceId: "dev-b" }), s.now);
          if (s.type === "remote") {
            // what follows a received stamp sorts after it
            expect(r.state.wallMs * 1e7 + r.state.counter).toBeGreaterThan(s.wall * 1e7 + s.counter);
          }
          expect(r.stamp > last).toBe(true);
          last = r.stamp;
          c = r.state;
        }
      }),
    );
  });
});

describe("receive", () => {
  it("puts the next local stamp after a remote stamp from a clock that runs ahead", () => {
    const local = tick(createClock("slow"), 1000).state;
    const remote = formatStamp({ wallMs: 9000, counter: 4, deviceId: "fast" });
    const after = receive(local, remote, 1001).state;
    const next = tick(after, 1002).stamp;
    expect(compareStamps(next, remote)).toBe(1);
    expect(parseStamp(next)).toEqual({ wallMs: 9000, counter: 6, deviceId: "slow" });
  });

  it("takes the wall time when it is ahead of both clocks", () => {
    const local = tick(createClock("a"), 1000).state;
    const r = receive(local, formatStamp({ wallMs: 1200, counter: 3, deviceId: "b" }), 5000);
    expect(parseStamp(r.stamp)).toEqual({ wallMs: 5000, counter: 0, deviceId: "a" });
  });

  it("refuses a stamp further ahead than the allowed drift and leaves the clock alone", () => {
    const local = tick(createClock("a"), 1000).state;
    const far = formatStamp({ wallMs: 1000 + 3_600_000, counter: 0, deviceId: "b" });
    expect(() => receive(local, far, 1000, { maxAheadMs: 60_000 })).toThrow(ClockDriftError);
    expect(local).toEqual({ wallMs: 1000, counter: 0, deviceId: "a" });
  });
});
