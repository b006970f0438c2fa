/**
 * The date range of an audit log download: From and To are whole days (UTC), both included.
 * A range runs forwards, inside the years 2000–2099, and covers at most one year (366 days), so
 * one download stays a size a spreadsheet opens; a longer stretch is downloaded a year at a time.
 * Left out, To is today and From is 30 days before To.
 */
import { z } from "zod";
import { auditFilterSchema, type AuditFilter } from "./list-queries";

export const AUDIT_RANGE_MAX_DAYS = 366;
export const AUDIT_RANGE_DEFAULT_DAYS = 30;
const DAY_MS = 24 * 60 * 60 * 1000;

/** "YYYY-MM-DD" of a moment, in UTC. */
export const isoDay = (d: Date) => d.toISOString().slice(0, 10);

/** The moment a day starts (UTC), or null when the text is not a day on the calendar. */
export function dayStart(text: string): Date | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!m) return null;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const at = new Date(0);
  at.setUTCFullYear(y, mo - 1, d); // Date.UTC would read the years 0–99 as 1900–1999

  return at.getUTCFullYear() === y && at.getUTCMonth() === mo - 1 && at.getUTCDate() === d ? at : null;
}

function day(label: string) {
  return z
    .string()
    .trim()
    .max(10, `${label}: a date like 2026-03-31`)
    .optional()
    .transform((v, ctx) => {
      if (!v) return undefined;
      if (!/^\d{4}-\d{2}-\d{2}$/.test(v)) {
        ctx.addIssue({ code: "custom", message: `${label}: a date like 2026-03-31` });
        return z.NEVER;
      }
      const year = Number(v.slice(0, 4));
      if (year < 2000 || year > 2099) {
        ctx.addIssue({ code: "custom", message: `${label}: a date in the years 2000 to 2099` });
        return z.NEVER;
      }
      const at = dayStart(v);
      if (!at) {
        ctx.addIssue({ code: "custom", message: `${label}: ${v} is not a day on the calendar` });
        return z.NEVER;
      }
      return at;
    });
}

/** The moments a range selects: from `from` (included) to `until` (excluded, the day after To). */
export interface AuditRange {
  from: Date;
  until: Date;
  /** The days as typed or defaulted, for the file name. */
  fromDay: string;
  toDay: string;
}

/** A download's filters and its range. */
export interface AuditExport {
  filter: AuditFilter;
  range: AuditRange;
}

/** The query of a download: the page's filters, and From and To checked and with their defaults; `today` is the day To defaults to. */
export function auditExportSchema(today: () => Date = () => new Date()) {
  return auditFilterSchema
    .extend({ from: day("From"), to: day("To") })
    .transform(({ from: fromDay, to: toDay, ...filter }, ctx): AuditExport => {
      const to = toDay ?? dayStart(isoDay(today()))!;
      const from = fromDay ?? new Date(to.getTime() - AUDIT_RANGE_DEFAULT_DAYS * DAY_MS);
      const days = Math.round((to.getTime() - from.getTime()) / DAY_MS) + 1;
      if (days < 1) {
        ctx.addIssue({
          code: "custom",
          path: ["to"],
          message: `To: ${isoDay(to)} comes before From (${isoDay(from)}); To is the last day`,
        });
        return z.NEVER;
      }
      if (days > AUDIT_RANGE_MAX_DAYS) {
        ctx.addIssue({
          code: "custom",
          path: ["to"],
          message: `Dates: at most one year (${AUDIT_RANGE_MAX_DAYS} days) at a time, and ${isoDay(from)} to ${isoDay(to)} is ${days} days; download a longer stretch a year at a time`,
        });
        return z.NEVER;
      }
      return { filter, range: { from, until: new Date(to.getTime() + DAY_MS), fromDay: isoDay(from), toDay: isoDay(to) } };
    });
}
