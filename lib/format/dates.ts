/**
 * The one way dates and times are written on the office, review and customer screens (and the
 * bench): day month year, 24-hour clock — "3 Dec 2026", "3 Dec 2026, 09:12". Every screen formats
 * through these; nothing else calls toLocale*String or Intl.DateTimeFormat for a date.
 */
const DAY: Intl.DateTimeFormatOptions = { day: "numeric", month: "short", year: "numeric" };
const TIME: Intl.DateTimeFormatOptions = { hour: "2-digit", minute: "2-digit", hourCycle: "h23" };

const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(key: string, options: Intl.DateTimeFormatOptions, timeZone?: string): Intl.DateTimeFormat {
  const k = `${key}|${timeZone ?? ""}`;
  let f = formatters.get(k);
  if (!f) {
    f = new Intl.DateTimeFormat("en-GB", timeZone ? { ...options, timeZone } : options);
    formatters.set(k, f);
  }
  return f;
}

type DateLike = Date | string | number;
const asDate = (v: DateLike) => (v instanceof Date ? v : new Date(v));
const valid = (d: Date) => Number.isFinite(d.getTime());

/** "3 Dec 2026". */
export function formatDay(v: DateLike, timeZone?: string): string {
  const d = asDate(v);
  return valid(d) ? formatter("day", DAY, timeZone).format(d) : "—";
}

/** "3 Dec 2026, 09:12". */
export function formatDayTime(v: DateLike, timeZone?: string): string {
  const d = asDate(v);
  return valid(d) ? formatter("dayTime", { ...DAY, ...TIME }, timeZone).format(d) : "—";
}

/** "3 Dec 2026, 09:12:05" (the audit log, where seconds matter). */
export function formatDayTimeSeconds(v: DateLike, timeZone?: string): string {
  const d = asDate(v);
  return valid(d) ? formatter("dayTimeS", { ...DAY, ...TIME, second: "2-digit" }, timeZone).format(d) : "—";
}

/** "09:12" (the bench, where the day is today). */
export function formatTime(v: DateLike, timeZone?: string): string {
  const d = asDate(v);
  return valid(d) ? formatter("time", TIME, timeZone).format(d) : "—";
}

/** The shop's wall clock now: the calendar day ("YYYY-MM-DD") and the time ("HH:MM", 24-hour) in its zone. */
export function wallClockIn(timeZone: string, at: Date = new Date()): { day: string; time: string } {
  const parts = new Intl.DateTimeFormat("en-CA", {
    timeZone,
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
    hour: "2-digit",
    minute: "2-digit",
    hourCycle: "h23",
  }).formatToParts(at);
  const get = (t: string) => parts.find((p) => p.type === t)!.value;
  return { day: `${get("year")}-${get("month")}-${get("day")}`, time: `${get("hour")}:${get("minute")}` };
}
