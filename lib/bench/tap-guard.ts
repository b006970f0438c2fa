/**
 * A confirm records once per deliberate tap. A tap is taken when no save from the previous one is
 * still in flight and at least `windowMs` have passed since the previous tap taken; anything else
 * (a bounce, a second finger, a double tap 60 ms apart) is ignored. Pure: the caller gives the time.
 */

/** Long enough to swallow a double tap or a glove's bounce, short enough not to slow a mechanic down (common practice, no source). */
export const REPEAT_TAP_WINDOW_MS = 600;

export interface TapGuard {
  /** Whether a tap at `nowMs` is taken; a taken tap starts a save that must be ended with `finish`. */
  take(nowMs: number): boolean;
  finish(): void;
  /** Whether a tap at `nowMs` would be ignored. */
  resting(nowMs: number): boolean;
}

export function createTapGuard(windowMs = REPEAT_TAP_WINDOW_MS): TapGuard {
  let saving = false;
  let lastTakenAt = Number.NEGATIVE_INFINITY;
  const resting = (nowMs: number) => saving || nowMs - lastTakenAt < windowMs;
  return {
    take(nowMs) {
      if (resting(nowMs)) return false;
      saving = true;
      lastTakenAt = nowMs;
      return true;
    },
    finish() {
      saving = false;
    },
    resting,
  };
}
