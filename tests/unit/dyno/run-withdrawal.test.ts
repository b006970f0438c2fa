import { describe, expect, it } from "vitest";
import { countingRuns, runWithdrawalSchema } from "@/lib/dyno";

describe("dyno run withdrawal input", () => {
  it("a reason is required: blank, too short and too long are refused with a message", () => {
    for (const [body, message] of [
      [{}, "Say why the run is withdrawn."],
      [{ reason: "   " }, "Say why the run is withdrawn (at least 5 characters)."],
      [{ reason: "bad" }, "Say why the run is withdrawn (at least 5 characters)."],
      [{ reason: "x".repeat(501) }, "Keep the reason under 500 characters."],
      [{ reason: "Wrong file loaded", extra: 1 }, undefined],
    ] as const) {
      const r = runWithdrawalSchema.safeParse(body);
      expect(r.success, JSON.stringify(body)).toBe(false);
      if (message) expect(r.error?.issues[0].message).toBe(message);
    }
  });

  it("only runs not withdrawn count", () => {
    const runs = [
      { id: "a", withdrawn: null },
      { id: "b", withdrawn: { at: "2026-12-01T10:00:00.000Z", byName: "Dana Kowal", reason: "wrong file" } },
      { id: "c", withdrawn: null },
    ];
    expect(countingRuns(runs).map((r) => r.id)).toEqual(["a", "c"]);
  });
});
