import { describe, expect, it } from "vitest";
import { comeBackFindingSchema, handedOverMessage, openComeBackSchema } from "@/lib/aftercare/come-backs";
import { addDays, dayIn, dueDateProblem, newReminderSchema, reminderMail, reminderState } from "@/lib/aftercare/reminders";
import { pairByKey, readingPlace } from "@/lib/aftercare/side-by-side";

describe("reminder days", () => {
  it("adds calendar days across month, year and leap-day ends", () => {
    expect(addDays("2026-12-03", 30)).toBe("2027-01-02");
    expect(addDays("2028-02-28", 1)).toBe("2028-02-29");
    expect(addDays("2027-02-28", 1)).toBe("2027-03-01");
    expect(addDays("2026-12-03", -3)).toBe("2026-11-30");
  });

  it("reads today in the shop's zone (Pacific/Auckland is already a day ahead at 20:00 UTC)", () => {
    const at = new Date("2026-12-03T20:00:00Z");
    expect(dayIn("UTC", at)).toBe("2026-12-03");
    expect(dayIn("Pacific/Auckland", at)).toBe("2026-12-04");
  });

  it("says where a reminder stands: overdue after its day, due within the week ahead, coming later, done once recorded", () => {
    expect(reminderState("2026-12-02", "2026-12-03", false)).toBe("overdue");
    expect(reminderState("2026-12-03", "2026-12-03", false)).toBe("due");
    expect(reminderState("2026-12-10", "2026-12-03", false)).toBe("due");
    expect(reminderState("2026-12-11", "2026-12-03", false)).toBe("coming");
    expect(reminderState("2026-12-02", "2026-12-03", true)).toBe("done");
  });

  it("refuses a due date in the past or more than ten years away, with the reason", () => {
    expect(dueDateProblem("2026-12-02", "2026-12-03")).toBe(
      "Due date 2 Dec 2026 is in the past: a reminder must be due today (3 Dec 2026) or later.",
    );
    expect(dueDateProblem("2026-12-03", "2026-12-03")).toBeNull();
    expect(dueDateProblem("2036-12-04", "2026-12-03")).toBe("Due date 4 Dec 2036 is more than ten years away.");
  });

  it("checks the office's reminder in workshop words", () => {
    const bad = newReminderSchema.safeParse({ label: "ab", dueOn: "2026-13-01", dueOdometerKm: 1.5 });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues.map((i) => i.message)).toEqual([
      "Say what the reminder is for (e.g. run-in check).",
      "Due date must be a real day between the years 2000 and 2099.",
      "Due at (km) must be a whole number of km.",
    ]);
  });

  it("writes the customer's e-mail with the distance and the day, whichever comes first", () => {
    const m = reminderMail({
      shopName: "Gannet Street Engine Works",
      customerName: "Ida Brannock",
      label: "Run-in check",
      dueOn: "2027-01-02",
      dueOdometerKm: 15840,
      make: "Tern",
      model: "Velo 750",
      tagCode: "GSW-1040",
      workOrderNumber: 1040,
    });
    expect(m.subject).toBe("Run-in check due for your Tern Velo 750");
    expect(m.text).toContain("is due for: Run-in check, at 15,840 km on the odometer or on 2 Jan 2027, whichever comes first.");
  });
});

describe("come-back input", () => {
  it("names the field the office sees", () => {
    const r = openComeBackSchema.safeParse({ originalWorkOrderId: "x", riderReport: "", warrantyClaimed: "yes", odometerKm: -1 });
    expect(r.error!.issues.map((i) => i.message)).toEqual([
      "Choose the handed-over work order the bike came back from.",
      "Write down what the rider reports.",
      "Say whether the rider claims warranty.",
      "Odometer must be between 0 and 2,000,000 km.",
    ]);
    const f = comeBackFindingSchema.safeParse({ underWarranty: true, cause: "our_workmanship", note: "z".repeat(2001) });
    expect(f.error!.issues.map((i) => i.message)).toEqual(["What was found: at most 2000 characters."]);
  });

  it("tells a mechanic to ask, and offers the come-back to those who may open one", () => {
    const h = { number: 1040, tagCode: "GSW-1040", handedOverOn: "2026-11-14T10:00:00Z" };
    expect(handedOverMessage({ ...h, canOpenComeBack: false })).toBe(
      "Bike GSW-1040 was handed over on 14 Nov 2026 (job #1040) and has no open job. If it is back with a fault, ask the office or a supervisor to open a come-back.",
    );
    expect(handedOverMessage({ ...h, canOpenComeBack: true })).toBe(
      "Bike GSW-1040 was handed over on 14 Nov 2026 (job #1040) and has no open job. If it is back with a fault, open a come-back linked to job #1040.",
    );
    // a handover late in the evening in a shop west of Greenwich is that shop's day, not the next day in UTC
    const evening = { number: 7, tagCode: "GSW-0007", handedOverOn: "2026-11-15T02:30:00Z", canOpenComeBack: true };
    expect(handedOverMessage(evening, "America/Denver")).toMatch(/^Bike GSW-0007 was handed over on 14 Nov 2026 /);
    expect(handedOverMessage(evening, "Europe/London")).toMatch(/^Bike GSW-0007 was handed over on 15 Nov 2026 /);
  });
});

describe("side by side", () => {
  it("pairs rows by key, the original's order first, then what only the come-back has", () => {
    const rows = pairByKey(
      [
        { k: "a", v: 1 },
        { k: "b", v: 2 },
        { k: "a", v: 3 },
      ],
      [
        { k: "b", v: 20 },
        { k: "c", v: 30 },
      ],
      (x) => x.k,
    );
    expect(rows.map((r) => [r.key, r.then.map((x) => x.v), r.now.map((x) => x.v)])).toEqual([
      ["a", [1, 3], []],
      ["b", [2], [20]],
      ["c", [], [30]],
    ]);
    expect(readingPlace({ label: "Cover gap", readingIndex: 1, readingLabels: ["Left", "Right"] })).toBe("Cover gap · Right");
    expect(readingPlace({ label: "Cover gap", readingIndex: 2, readingLabels: [] })).toBe("Cover gap · reading 3");
  });
});
