import { describe, expect, it } from "vitest";
import { createTapGuard, REPEAT_TAP_WINDOW_MS } from "@/lib/bench/tap-guard";

describe("tap guard on a confirm", () => {
  it("takes one of two taps 60 ms apart, and ignores taps while the save is in flight", () => {
    const guard = createTapGuard();
    expect(guard.take(1000)).toBe(true);
    expect(guard.take(1060)).toBe(false);
    guard.finish();
    expect(guard.take(1060)).toBe(false); // still within the window
    expect(guard.take(1000 + REPEAT_TAP_WINDOW_MS)).toBe(true);
    // a slow save: past the window but not finished
    expect(guard.take(1000 + 3 * REPEAT_TAP_WINDOW_MS)).toBe(false);
    guard.finish();
    expect(guard.resting(1000 + 3 * REPEAT_TAP_WINDOW_MS)).toBe(false);
    expect(guard.take(1000 + 3 * REPEAT_TAP_WINDOW_MS)).toBe(true);
  });
});
