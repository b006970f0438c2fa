import { describe, expect, it } from "vitest";
import { shopDay, signOffRows, withdrawnRows } from "@/app/_server/report/report-rows";
import type { HandoverReportData } from "@/db/records/handover-report";

// The build report dates what was done by the shop's own calendar: a sign-off at 20:00 UTC on
// 2 December was made on 3 December in a shop fourteen hours ahead (it printed the UTC day).

const evening = new Date("2026-12-02T20:00:00Z");
const report = (timeZone: string) =>
  ({
    job: { timeZone },
    steps: [{ stageKey: "close", stageTitle: "Close up" }],
    signOffs: [{ id: "s1", stageKey: "close", signedBy: "Tomas", signedAt: evening }],
    decisions: [{ signOffId: "s1", decision: "approved", decidedBy: "Dana", decidedAt: evening, reason: "" }],
    withdrawn: [
      { what: "Torque bolt", recordedBy: "Tomas", recordedAt: evening, withdrawnBy: "Tomas", withdrawnAt: evening, reason: "Wrong bolt" },
    ],
  }) as unknown as HandoverReportData;

describe("days in the build report", () => {
  it("are the shop's days, not UTC's", () => {
    expect(shopDay("Pacific/Kiritimati", evening)).toBe("2026-12-03");
    expect(shopDay("Europe/London", evening)).toBe("2026-12-02");
    expect(shopDay("America/Los_Angeles", new Date("2026-12-03T03:00:00Z"))).toBe("2026-12-02");
  });

  it("sign-offs, decisions and withdrawals are dated by the shop's calendar", () => {
    expect(signOffRows(report("Pacific/Kiritimati"))).toEqual([["Close up", "Tomas, 2026-12-03", "Approved by Dana, 2026-12-03"]]);
    expect(signOffRows(report("UTC"))).toEqual([["Close up", "Tomas, 2026-12-02", "Approved by Dana, 2026-12-02"]]);
    expect(withdrawnRows(report("Pacific/Kiritimati"))).toEqual([["Torque bolt", "Tomas, 2026-12-03", "Tomas, 2026-12-03", "Wrong bolt"]]);
  });
});
