import { describe, expect, it } from "vitest";
import { formatStamp } from "@/lib/sync/hlc";
import { currentReadings, readingVerdict } from "@/lib/sync/readings";

const s = (wallMs: number, deviceId = "t1") => formatStamp({ wallMs, counter: 0, deviceId });
const r = (id: string, stamp: string, supersedesId: string | null = null, readingIndex = 0) => ({
  id,
  specId: "bore",
  readingIndex,
  stamp,
  supersedesId,
});

describe("current reading", () => {
  it("is the latest stamp among readings nobody superseded", () => {
    const readings = [r("a", s(100)), r("b", s(300, "t2")), r("c", s(200))];
    expect(currentReadings(readings).map((x) => x.id)).toEqual(["b"]);
  });

  it("drops a superseded reading even when the correction is older than another tablet's reading", () => {
    const readings = [r("a", s(100)), r("fix", s(400), "b"), r("b", s(300, "t2"))];
    expect(currentReadings(readings).map((x) => x.id)).toEqual(["fix"]);
    const onlyCorrected = [r("a", s(500)), r("fix", s(400), "b"), r("b", s(300, "t2"))];
    expect(currentReadings(onlyCorrected).map((x) => x.id)).toEqual(["a"]);
  });

  it("keeps one current reading per spot", () => {
    const readings = [r("a", s(100), null, 0), r("b", s(100), null, 1), r("c", s(200), null, 1)];
    expect(
      currentReadings(readings)
        .map((x) => x.id)
        .sort(),
    ).toEqual(["a", "c"]);
  });
});

describe("verdict", () => {
  const spec = { unit: "mm" as const, min: 75.995, max: 76.015, nominal: 76 };
  it("counts the limits as in, and compares inches exactly", () => {
    expect(readingVerdict(75.995, "mm", spec)).toBe("in");
    expect(readingVerdict(76.015, "mm", spec)).toBe("in");
    expect(readingVerdict(75.9949, "mm", spec)).toBe("low");
    expect(readingVerdict(76.0151, "mm", spec)).toBe("high");
    // 2.9925 in = 76.0095 mm
    expect(readingVerdict(2.9925, "in", spec)).toBe("in");
    // 0.001 in = 0.0254 mm exactly: on the max limit
    expect(readingVerdict(0.001, "in", { unit: "mm", min: 0.02, max: 0.0254, nominal: null })).toBe("in");
    expect(readingVerdict(25.5, "µm", { unit: "mm", min: 0.02, max: 0.0254, nominal: null })).toBe("high");
  });
});
