/**
 * Which timers the bench sounds an alert for. A timer alerts once it has run out, until someone
 * acknowledges it on this tablet — but only for a while after it ran out: a tablet that opens a
 * job hours after its cure time ended (another tablet's timer, or this one switched off overnight)
 * is not greeted with a stale alarm. The step itself still shows the timer as done. Pure.
 */

/** How long after running out a timer still raises the alert (common practice, no source: a shift's break). */
export const ALERT_WINDOW_MS = 60 * 60_000;

export interface AlertTimer {
  id: string;
  endsAtMs: number;
}

export function dueAlerts<T extends AlertTimer>(
  timers: readonly T[],
  nowMs: number,
  acknowledged: ReadonlySet<string>,
  windowMs = ALERT_WINDOW_MS,
): T[] {
  return timers.filter((t) => t.endsAtMs <= nowMs && nowMs - t.endsAtMs <= windowMs && !acknowledged.has(t.id));
}
