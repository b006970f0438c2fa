import { describe, expect, it } from "vitest";
import { compareCursors, isAtLeast, laterCursor } from "@/lib/sync/cursor";

describe("server cursors", () => {
  it("compare as numbers, up to the 18 digits the format allows", () => {
    expect(compareCursors("9", "10")).toBe(-1);
    expect(compareCursors("100", "12")).toBe(1);
    expect(compareCursors("999999999999999999", "999999999999999998")).toBe(1);
    expect(compareCursors("0", "0")).toBe(0);
    expect(isAtLeast("12", "12")).toBe(true);
    expect(isAtLeast("11", "12")).toBe(false);
    expect(isAtLeast(null, "0")).toBe(false);
    expect(laterCursor("7", "12")).toBe("12");
    expect(laterCursor("120", "12")).toBe("120");
    expect(laterCursor(undefined, "3")).toBe("3");
  });
});
