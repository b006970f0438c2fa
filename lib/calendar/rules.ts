import { z } from "zod";
import { addDays, dayLabel } from "../aftercare/reminders";
import { safeText } from "../safe-values";

// The shop's calendar, as rules: what may be booked, and how a booking and a clash are said.
// Times are wall-clock times in the shop's zone: a booking is one day ("YYYY-MM-DD") from one time
// ("HH:MM") to a later one, inside the shop's opening hours. PostgreSQL turns them into instants.

export const RESOURCE_KINDS = ["bay", "lift", "dyno", "mechanic"] as const;
export type ResourceKind = (typeof RESOURCE_KINDS)[number];
export const RESOURCE_KIND_LABELS: Record<ResourceKind, string> = { bay: "Bay", lift: "Lift", dyno: "Dyno", mechanic: "Mechanic" };

export interface OpeningHours {
  /** "HH:MM" or "HH:MM:SS" as PostgreSQL gives a time. */
  opensAt: string;
  closesAt: string;
  /** ISO weekdays: 1 Monday … 7 Sunday. */
  openDays: number[];
}

const WEEKDAY_NAMES = ["Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday", "Sunday"];

/** ISO weekday (1 Monday … 7 Sunday) of a calendar day. */
export function isoWeekday(day: string): number {
  const d = new Date(`${day}T12:00:00Z`).getUTCDay();
  return d === 0 ? 7 : d;
}

/** The Monday of the week holding `day`. */
export function weekStart(day: string): string {
  return addDays(day, 1 - isoWeekday(day));
}

/** The seven days of the week starting `monday`. */
export function weekDays(monday: string): string[] {
  return Array.from({ length: 7 }, (_, i) => addDays(monday, i));
}

/** "09:00" from "09:00:00". */
export const hhmm = (t: string) => t.slice(0, 5);

/** A short day as the calendar says it: "4 Dec". */
export function shortDay(day: string): string {
  return dayLabel(day).replace(/ \d{4}$/, "");
}

/** Who or what a clash names first: "The dyno" for a resource called just "Dyno", else its own name. */
export function resourceSubject(kind: ResourceKind, name: string): string {
  return name.trim().toLowerCase() === kind ? `The ${kind}` : name;
}

/** The sentence for a refused double booking: "The dyno is booked for job #1003, 09:00–11:00 on 4 Dec." */
export function clashMessage(
  resource: { kind: ResourceKind; name: string },
  other: { number: number; day: string; from: string; to: string },
) {
  return `${resourceSubject(resource.kind, resource.name)} is booked for job #${other.number}, ${hhmm(other.from)}–${hhmm(other.to)} on ${shortDay(other.day)}.`;
}

/** Why a booking's day and times are refused against the opening hours (and, given the shop's
 * wall-clock now, against time already gone), or null when they fit. */
export function bookingTimeProblem(
  b: { day: string; from: string; to: string },
  hours: OpeningHours,
  now?: { day: string; time: string },
): { path: string; message: string } | null {
  if (b.to <= b.from) return { path: "to", message: `Until (${b.to}) must be after from (${b.from}).` };
  if (now && (b.day < now.day || (b.day === now.day && b.to <= now.time)))
    return {
      path: b.day < now.day ? "day" : "to",
      message: `${dayLabel(b.day)} ${b.from}–${b.to} is already over (it is ${now.time} on ${dayLabel(now.day)}): book a time still to come.`,
    };
  const wd = isoWeekday(b.day);
  const open = `${hhmm(hours.opensAt)}–${hhmm(hours.closesAt)}`;
  if (!hours.openDays.includes(wd))
    return { path: "day", message: `The shop is closed on ${WEEKDAY_NAMES[wd - 1]}s (${dayLabel(b.day)}): book an opening day.` };
  if (b.from < hhmm(hours.opensAt) || b.to > hhmm(hours.closesAt))
    return { path: b.from < hhmm(hours.opensAt) ? "from" : "to", message: `${b.from}–${b.to} is outside opening hours (${open}).` };
  return null;
}

const day = (label: string) =>
  z
    .string({ error: `${label} must be a date.` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, `${label} must be a date (YYYY-MM-DD).`)
    .refine((s) => {
      const t = Date.parse(`${s}T00:00:00Z`);
      return Number.isFinite(t) && new Date(t).toISOString().slice(0, 10) === s && s >= "2000-01-01" && s < "2100-01-01";
    }, `${label} must be a real day between the years 2000 and 2099.`);
export const calendarDay = day;

const clock = (label: string) =>
  z.string({ error: `${label} must be a time.` }).regex(/^([01]\d|2[0-3]):[0-5]\d$/, `${label} must be a time of day (HH:MM, 24-hour).`);

const uuid = (label: string) => z.string({ error: `Choose the ${label}.` }).uuid(`Choose the ${label}.`);

export const newBookingSchema = z
  .object({
    resourceId: uuid("resource"),
    workOrderId: uuid("job"),
    day: day("Day"),
    from: clock("From"),
    to: clock("Until"),
    note: safeText({ label: "Note", max: 500 }).optional(),
  })
  .strict();
export type NewBookingInput = z.infer<typeof newBookingSchema>;

const reason = (label: string) => safeText({ label, min: 3, max: 500, tooShort: `${label}: say why, at least 3 characters.` });

export const cancelBookingSchema = z.object({ reason: reason("Reason") }).strict();
export const retireResourceSchema = z.object({ reason: reason("Reason") }).strict();

export const newResourceSchema = z
  .object({
    kind: z.enum(RESOURCE_KINDS, { error: "Kind must be a bay, a lift, the dyno or a mechanic." }),
    name: safeText({ label: "Name", min: 1, max: 80 }),
    userId: uuid("mechanic").nullable().optional(),
  })
  .strict()
  .refine((r) => !r.userId || r.kind === "mechanic", { path: ["userId"], message: "Only a mechanic resource names a person." });
export type NewResourceInput = z.infer<typeof newResourceSchema>;

export const promiseSchema = z.object({ promisedOn: day("Promised date") }).strict();

/** The shop's opening hours as the office sets them: from and until (24-hour) and the days open. */
export const openingHoursSchema = z
  .object({
    opensAt: clock("Opens at"),
    closesAt: clock("Closes at"),
    openDays: z
      .array(z.number({ error: "Open days are weekdays 1 (Monday) to 7 (Sunday)." }).int().min(1).max(7), {
        error: "Choose the days the shop is open.",
      })
      .min(1, "Choose at least one day the shop is open.")
      .max(7)
      .refine((d) => new Set(d).size === d.length, "Each open day once."),
  })
  .strict()
  .refine((h) => h.closesAt > h.opensAt, { path: ["closesAt"], message: "Closes at must be after opens at." });
export type OpeningHoursInput = z.infer<typeof openingHoursSchema>;
export const WEEKDAY_LABELS = WEEKDAY_NAMES;
