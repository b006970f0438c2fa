import { describe, expect, it } from "vitest";
import { auditExportSchema, dayStart } from "@/lib/review/audit-range";
import { issuesOf } from "@/lib/zod-issues";

const today = () => new Date("2026-12-03T15:20:00Z");
const parse = (q: Record<string, string>) => auditExportSchema(today).safeParse(q);
const problems = (q: Record<string, string>) => {
  const r = parse(q);
  return r.success ? [] : issuesOf(r.error);
};

describe("audit download: the date range", () => {
  it("reads From and To as whole days, To included, and keeps the page's filters", () => {
    const r = parse({ from: "2026-03-01", to: "2026-03-31", job: "1007", outcome: "refused" });
    expect(r.success).toBe(true);
    expect(r.data?.range).toEqual({
      from: new Date("2026-03-01T00:00:00Z"),
      until: new Date("2026-04-01T00:00:00Z"),
      fromDay: "2026-03-01",
      toDay: "2026-03-31",
    });
    expect(r.data?.filter).toEqual({ job: 1007, outcome: "refused", action: undefined, q: "" });
  });

  it("left out, To is today and From 30 days before it", () => {
    expect(parse({}).data?.range).toMatchObject({ fromDay: "2026-11-03", toDay: "2026-12-03" });
    expect(parse({ to: "2026-02-10" }).data?.range).toMatchObject({ fromDay: "2026-01-11", toDay: "2026-02-10" });
  });

  it("takes one year, leap day included, and refuses a day more with the reason", () => {
    // 2024 is a leap year (common practice: divisible by 4, not a century): 366 days.
    expect(parse({ from: "2024-01-01", to: "2024-12-31" }).success).toBe(true);
    expect(problems({ from: "2024-01-01", to: "2025-01-01" })).toEqual([
      {
        path: "to",
        message:
          "Dates: at most one year (366 days) at a time, and 2024-01-01 to 2025-01-01 is 367 days; download a longer stretch a year at a time",
      },
    ]);
    // From alone, a long way back: To is today, so the range is over a year.
    expect(problems({ from: "2025-01-01" })[0].message).toMatch(/^Dates: at most one year/);
  });

  it("refuses a range that ends before it starts", () => {
    expect(problems({ from: "2026-03-10", to: "2026-03-01" })).toEqual([
      { path: "to", message: "To: 2026-03-01 comes before From (2026-03-10); To is the last day" },
    ]);
    expect(parse({ from: "2026-03-10", to: "2026-03-10" }).success).toBe(true);
  });

  it("refuses days outside 2000–2099, days not on the calendar and text that is no date", () => {
    expect(problems({ from: "1999-12-31", to: "2000-01-05" })).toEqual([
      { path: "from", message: "From: a date in the years 2000 to 2099" },
    ]);
    expect(problems({ from: "2099-12-01", to: "2100-01-01" })).toEqual([{ path: "to", message: "To: a date in the years 2000 to 2099" }]);
    expect(problems({ from: "0000-01-01" })).toEqual([{ path: "from", message: "From: a date in the years 2000 to 2099" }]);
    expect(problems({ to: "2026-02-30" })).toEqual([{ path: "to", message: "To: 2026-02-30 is not a day on the calendar" }]);
    expect(problems({ from: "2026-13-01" })).toEqual([{ path: "from", message: "From: 2026-13-01 is not a day on the calendar" }]);
    for (const bad of ["yesterday", "NaN", "Infinity", "2026-3-1", "2026-03-01T00:00", "\u0000", "\ud800", "99999-01-01"])
      expect(problems({ from: bad })[0]?.message, bad).toBe("From: a date like 2026-03-31");
    expect(dayStart("2026-02-29")).toBeNull();
    expect(dayStart("2028-02-29")).toEqual(new Date("2028-02-29T00:00:00Z"));
    expect(dayStart("0001-01-01")?.getUTCFullYear()).toBe(1);
  });
});
