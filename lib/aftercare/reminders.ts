import { z } from "zod";
import { wallClockIn } from "../format/dates";
import { safeText } from "../safe-values";

// Reminders after handover: run-in check and first service, due on a date and optionally at an
// odometer reading, whichever comes first. Dates are calendar days (YYYY-MM-DD) in the shop's zone.

export const REMINDER_LABEL_MAX = 120;

/** The calendar day `days` after `day` (both YYYY-MM-DD). */
export function addDays(day: string, days: number): string {
  const t = Date.parse(`${day}T00:00:00Z`) + days * 86_400_000;
  return new Date(t).toISOString().slice(0, 10);
}

/** Today in a time zone, as YYYY-MM-DD. */
export function dayIn(timeZone: string, at: Date = new Date()): string {
  return wallClockIn(timeZone, at).day;
}

/** A calendar day as people read it: "3 Dec 2026". */
export function dayLabel(day: string): string {
  return new Date(`${day}T12:00:00Z`).toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
}

export type ReminderState = "done" | "overdue" | "due" | "coming";

/** How many days ahead a reminder counts as due (the office's week ahead). */
export const DUE_WINDOW_DAYS = 7;

export const REMINDER_STATE_LABELS: Record<ReminderState, string> = {
  done: "Done",
  overdue: "Overdue",
  due: "Due this week",
  coming: "Coming up",
};

/** Where a reminder stands on `today`: done, overdue (its day has passed), due (within the week ahead) or coming. */
export function reminderState(dueOn: string, today: string, done: boolean): ReminderState {
  if (done) return "done";
  if (dueOn < today) return "overdue";
  if (dueOn <= addDays(today, DUE_WINDOW_DAYS)) return "due";
  return "coming";
}

/** Why a due date is refused on `today`, or null when it is fine: not in the past, not beyond ten years. */
export function dueDateProblem(dueOn: string, today: string): string | null {
  if (dueOn < today) return `Due date ${dayLabel(dueOn)} is in the past: a reminder must be due today (${dayLabel(today)}) or later.`;
  if (dueOn > addDays(today, 3650)) return `Due date ${dayLabel(dueOn)} is more than ten years away.`;
  return null;
}

const isoDay = z
  .string({ error: "Due date must be a date." })
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Due date must be a date (YYYY-MM-DD).")
  .refine((s) => {
    const t = Date.parse(`${s}T00:00:00Z`);
    return Number.isFinite(t) && new Date(t).toISOString().slice(0, 10) === s && s >= "2000-01-01" && s < "2100-01-01";
  }, "Due date must be a real day between the years 2000 and 2099.");

/** A reminder the office adds by hand to a handed-over work order. */
export const newReminderSchema = z
  .object({
    label: safeText({ label: "Reminder", min: 3, max: REMINDER_LABEL_MAX, tooShort: "Say what the reminder is for (e.g. run-in check)." }),
    dueOn: isoDay,
    dueOdometerKm: z
      .number({ error: "Due at (km) must be a whole number of km." })
      .int("Due at (km) must be a whole number of km.")
      .min(0, "Due at (km) must be between 0 and 2,000,000 km.")
      .max(2_000_000, "Due at (km) must be between 0 and 2,000,000 km.")
      .nullable()
      .optional(),
  })
  .strict();
export type NewReminderInput = z.infer<typeof newReminderSchema>;

/** The office recording that a reminder's check or service was done. */
export const reminderDoneSchema = z
  .object({
    note: safeText({ label: "Note", max: 1000, multiline: true }),
    odometerKm: z
      .number({ error: "Odometer must be a whole number of km." })
      .int("Odometer must be a whole number of km.")
      .min(0, "Odometer must be between 0 and 2,000,000 km.")
      .max(2_000_000, "Odometer must be between 0 and 2,000,000 km.")
      .nullable()
      .optional(),
  })
  .strict();

export interface ReminderMailFacts {
  shopName: string;
  customerName: string;
  label: string;
  dueOn: string;
  dueOdometerKm: number | null;
  make: string;
  model: string;
  tagCode: string;
  workOrderNumber: number;
}

/** The customer's e-mail for a reminder that has come due. */
export function reminderMail(f: ReminderMailFacts): { subject: string; text: string } {
  const when =
    f.dueOdometerKm !== null
      ? `at ${f.dueOdometerKm.toLocaleString("en-GB")} km on the odometer or on ${dayLabel(f.dueOn)}, whichever comes first`
      : `on ${dayLabel(f.dueOn)}`;
  return {
    subject: `${f.label} due for your ${f.make} ${f.model}`,
    text: [
      `Hello ${f.customerName},`,
      "",
      `Your ${f.make} ${f.model} (tag ${f.tagCode}, our job #${f.workOrderNumber}) is due for: ${f.label}, ${when}.`,
      "Please call or reply to book it in. If it has been done already, let us know and we will note it.",
      "",
      f.shopName,
    ].join("\n"),
  };
}
