import { describe, expect, it } from "vitest";
import { ALERT_WINDOW_MS, dueAlerts } from "@/lib/bench/timer-alerts";

const now = Date.parse("2026-12-02T10:00:00.000Z");
const min = 60_000;

describe("timer alerts on the bench", () => {
  const timers = [
    { id: "running", endsAtMs: now + 5 * min },
    { id: "just-done", endsAtMs: now - 1 },
    { id: "done-at-now", endsAtMs: now },
    { id: "done-50-min-ago", endsAtMs: now - 50 * min },
    { id: "done-at-window-edge", endsAtMs: now - ALERT_WINDOW_MS },
    { id: "done-yesterday", endsAtMs: now - 20 * 60 * min },
  ];

  it("alerts for timers that ran out within the window, not for running or long-finished ones", () => {
    expect(dueAlerts(timers, now, new Set()).map((t) => t.id)).toEqual([
      "just-done",
      "done-at-now",
      "done-50-min-ago",
      "done-at-window-edge",
    ]);
  });

  it("an acknowledged timer stays quiet", () => {
    expect(dueAlerts(timers, now, new Set(["just-done", "done-50-min-ago"])).map((t) => t.id)).toEqual([
      "done-at-now",
      "done-at-window-edge",
    ]);
  });

  it("a running timer alerts once its end passes", () => {
    expect(dueAlerts(timers, now + 5 * min, new Set()).map((t) => t.id)).toContain("running");
  });
});
