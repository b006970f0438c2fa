import { describe, expect, it } from "vitest";
import { wallClockIn } from "@/lib/format/dates";
import { bookingTimeProblem, clashMessage, isoWeekday, newBookingSchema, resourceSubject, weekDays, weekStart } from "@/lib/calendar/rules";

// Calendar rules. Check values: 3 Dec 2026 is a Thursday and 7 Dec 2026 a Monday (any calendar).

const HOURS = { opensAt: "08:00:00", closesAt: "18:00:00", openDays: [1, 2, 3, 4, 5] };

describe("weeks", () => {
  it("ISO weekday and the Monday of the week, across a month and a year end", () => {
    expect(isoWeekday("2026-12-03")).toBe(4);
    expect(isoWeekday("2026-12-06")).toBe(7);
    expect(weekStart("2026-12-06")).toBe("2026-11-30");
    expect(weekStart("2026-12-07")).toBe("2026-12-07");
    expect(weekStart("2027-01-01")).toBe("2026-12-28");
    expect(weekDays("2026-12-28")).toEqual([
      "2026-12-28",
      "2026-12-29",
      "2026-12-30",
      "2026-12-31",
      "2027-01-01",
      "2027-01-02",
      "2027-01-03",
    ]);
  });
});

describe("booking times", () => {
  it("inside opening hours on an opening day is fine; the edges count as inside", () => {
    expect(bookingTimeProblem({ day: "2026-12-07", from: "08:00", to: "18:00" }, HOURS)).toBeNull();
  });
  it("refuses until before or equal to from, a closed day, and times outside the hours, naming the field", () => {
    expect(bookingTimeProblem({ day: "2026-12-07", from: "11:00", to: "09:00" }, HOURS)?.path).toBe("to");
    expect(bookingTimeProblem({ day: "2026-12-07", from: "11:00", to: "11:00" }, HOURS)?.path).toBe("to");
    expect(bookingTimeProblem({ day: "2026-12-12", from: "09:00", to: "10:00" }, HOURS)?.message).toMatch(/closed on Saturdays/);
    expect(bookingTimeProblem({ day: "2026-12-07", from: "07:45", to: "09:00" }, HOURS)).toEqual({
      path: "from",
      message: "07:45–09:00 is outside opening hours (08:00–18:00).",
    });
    expect(bookingTimeProblem({ day: "2026-12-07", from: "17:00", to: "18:15" }, HOURS)?.path).toBe("to");
  });
  it("refuses a slot already over by the shop's clock; a slot still running or to come is fine", () => {
    const now = { day: "2026-12-07", time: "10:30" };
    expect(bookingTimeProblem({ day: "2026-12-04", from: "09:00", to: "10:00" }, HOURS, now)).toEqual({
      path: "day",
      message: "4 Dec 2026 09:00–10:00 is already over (it is 10:30 on 7 Dec 2026): book a time still to come.",
    });
    expect(bookingTimeProblem({ day: "2026-12-07", from: "09:00", to: "10:30" }, HOURS, now)?.path).toBe("to");
    expect(bookingTimeProblem({ day: "2026-12-07", from: "10:00", to: "11:00" }, HOURS, now)).toBeNull();
    expect(bookingTimeProblem({ day: "2026-12-08", from: "08:00", to: "09:00" }, HOURS, now)).toBeNull();
  });
  it("the shop's wall clock is read in its own zone", () => {
    // 23:30 UTC on 6 Dec is 08:30 on 7 Dec in Tokyo (UTC+9, no summer time) and 23:30 in London (winter, UTC+0)
    const at = new Date("2026-12-06T23:30:00Z");
    expect(wallClockIn("Asia/Tokyo", at)).toEqual({ day: "2026-12-07", time: "08:30" });
    expect(wallClockIn("Europe/London", at)).toEqual({ day: "2026-12-06", time: "23:30" });
  });
  it("the input shape refuses impossible days and times in workshop words", () => {
    const base = { resourceId: crypto.randomUUID(), workOrderId: crypto.randomUUID(), day: "2026-12-07", from: "09:00", to: "10:00" };
    expect(newBookingSchema.safeParse(base).success).toBe(true);
    for (const [field, value, words] of [
      ["day", "2026-02-30", "Day must be a real day"],
      ["day", "0000-01-01", "Day must be a real day"],
      ["from", "24:00", "From must be a time of day"],
      ["to", "9:00", "Until must be a time of day"],
    ] as const) {
      const r = newBookingSchema.safeParse({ ...base, [field]: value });
      expect(r.success).toBe(false);
      expect(r.error!.issues.map((i) => i.message).join(" ")).toContain(words);
    }
  });
});

describe("the clash sentence", () => {
  it("names the resource, the job, the times and the day", () => {
    expect(resourceSubject("dyno", "Dyno")).toBe("The dyno");
    expect(resourceSubject("bay", "Bay 2")).toBe("Bay 2");
    expect(clashMessage({ kind: "dyno", name: "Dyno" }, { number: 1003, day: "2026-12-04", from: "09:00", to: "11:00" })).toBe(
      "The dyno is booked for job #1003, 09:00–11:00 on 4 Dec.",
    );
  });
});
