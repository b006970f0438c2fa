/**
 * Holds: a timer spec (a cure, a cool-down) holds back the step its template names
 * (`blocksStepKey`) until the wait is really over. One rule, used by the tablet to switch
 * recording off on the held step and by the merge to flag work stamped while the step was held.
 *
 * At a moment t, among the spec's timers started at or before t that were not cancelled, the one
 * started last decides (two tablets starting the same wait offline give two timers; the later one
 * is the conservative one):
 *  - none at all: held (the wait has not even begun);
 *  - overridden by a supervisor at or before t: released;
 *  - stopped before its time ran out: held (the wait was cut short; run it again or ask a supervisor);
 *  - otherwise released once its full time has run out, held until then.
 */

export interface HoldTimer {
  id: string;
  startedAtMs: number;
  durationS: number;
  stoppedAtMs: number | null;
  /** Cancelled timers (started by mistake) never count. */
  cancelled: boolean;
  /** When a supervisor let the held step go ahead; null when nobody did. */
  overrideAtMs: number | null;
}

export type HoldState =
  | { held: false; timer: HoldTimer }
  | { held: true; why: "not-started"; timer: null }
  | { held: true; why: "running"; timer: HoldTimer; endsAtMs: number }
  | { held: true; why: "stopped-early"; timer: HoldTimer };

/** Whether a step held by a timer spec with these timers is held at `atMs`. */
export function holdAt(timers: readonly HoldTimer[], atMs: number): HoldState {
  let latest: HoldTimer | null = null;
  for (const t of timers) {
    if (t.cancelled || t.startedAtMs > atMs) continue;
    if (!latest || t.startedAtMs > latest.startedAtMs || (t.startedAtMs === latest.startedAtMs && t.id > latest.id)) latest = t;
  }
  if (!latest) return { held: true, why: "not-started", timer: null };
  if (latest.overrideAtMs !== null && latest.overrideAtMs <= atMs) return { held: false, timer: latest };
  const endsAtMs = latest.startedAtMs + latest.durationS * 1000;
  if (latest.stoppedAtMs !== null && latest.stoppedAtMs < endsAtMs) return { held: true, why: "stopped-early", timer: latest };
  return endsAtMs <= atMs ? { held: false, timer: latest } : { held: true, why: "running", timer: latest, endsAtMs };
}

/** Whether `t` was running (started, not cancelled, stopped or overridden, time not yet up) at `atMs`. */
export function runningAt(t: HoldTimer, atMs: number): boolean {
  if (t.cancelled || t.startedAtMs > atMs) return false;
  if (t.overrideAtMs !== null && t.overrideAtMs <= atMs) return false;
  if (t.stoppedAtMs !== null && t.stoppedAtMs <= atMs) return false;
  return t.startedAtMs + t.durationS * 1000 > atMs;
}

/** The hold in a mechanic's words, for flags and the bench: "running until 10:42 UTC", "never started", "stopped early". */
export function describeHold(label: string, state: Extract<HoldState, { held: true }>): string {
  switch (state.why) {
    case "not-started":
      return `“${label}” had not been started`;
    case "running":
      return `“${label}” was running until ${new Date(state.endsAtMs).toISOString().slice(11, 16)} UTC`;
    case "stopped-early":
      return `“${label}” had been stopped before its time was up`;
  }
}
