/**
 * A closed record stays closed. Once a work order is handed over (or cancelled), nothing changes
 * its record in place. What happens to each kind of thing added afterwards, and why:
 *   - bench work from a tablet (steps, readings, torque, timers, photos, parts, sign-offs): kept and
 *     flagged (sync rule 6) — it was recorded offline before the tablet knew, and nothing recorded
 *     is lost; a supervisor accepts it (a new revision of the stored report) or leaves it open;
 *   - dyno runs, parts, notes with photos entered from the office or the dyno page, a new build
 *     sheet (its targets are in the report), a new tune version (the report names the tune the
 *     bike left with) and a change of mechanic: refused — they are typed online, so the person sees the refusal at once and still
 *     has what they typed; work on a bike that has left belongs on a new work order.
 * Withdrawing a dyno run recorded by mistake stays possible (a correction pointing at the old
 * record, never an edit): it is an accepted change and makes a new revision of the stored report.
 * Pure.
 */
import { isClosed, STATUS_LABELS, type WorkOrderStatus } from "./status";

export const AFTER_CLOSE = {
  "bench work": "kept and flagged",
  "dyno run": "refused",
  part: "refused",
  note: "refused",
  photo: "refused",
  "mechanic assignment": "refused",
  "build sheet": "refused",
  "tune version": "refused",
  "dyno run withdrawal": "allowed (a new report revision)",
} as const;

/** The kinds of addition refused once the record is closed. */
export type RefusedAfterClose = {
  [K in keyof typeof AFTER_CLOSE]: (typeof AFTER_CLOSE)[K] extends "refused" ? K : never;
}[keyof typeof AFTER_CLOSE];

const WHAT: Record<RefusedAfterClose, string> = {
  "dyno run": "A dyno run",
  part: "A part",
  note: "A note",
  photo: "A photo",
  "mechanic assignment": "A change of mechanic",
  "build sheet": "A change to the build sheet",
  "tune version": "A new tune version",
};

/** Why `kind` may not be added to this work order any more, or null while its record is open. */
export function closedRecordRefusal(job: { number: number; status: WorkOrderStatus }, kind: RefusedAfterClose): string | null {
  if (!isClosed(job.status)) return null;
  return `Work order #${job.number} is ${STATUS_LABELS[job.status].toLowerCase()}: its record is closed. ${WHAT[kind]} for a bike that has left belongs on a new work order (book the bike in again).`;
}
