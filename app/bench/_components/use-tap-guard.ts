"use client";

import { useEffect, useRef, useState } from "react";
import { createTapGuard, REPEAT_TAP_WINDOW_MS } from "@/lib/bench/tap-guard";
import { announceNotSaved } from "@/lib/client/not-saved";

/**
 * One tap per deliberate press (`lib/bench/tap-guard.ts`) for a bench control that records: `tap`
 * runs the save for a tap the guard takes and nothing for one it ignores (a second finger, a glove's
 * bounce, a tap while the save is still being written); `resting` is true from a taken tap until the
 * window after it has passed, for the control to show itself disabled. A save that fails (the
 * tablet's storage full, its store closed) is said in the bench's "Not saved" notice.
 */
export function useTapGuard() {
  const guard = useRef(createTapGuard());
  const [resting, setResting] = useState(false);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  useEffect(() => () => void (timer.current && clearTimeout(timer.current)), []);

  async function tap(save: () => unknown): Promise<void> {
    const at = performance.now();
    if (!guard.current.take(at)) return;
    setResting(true);
    try {
      await save();
    } catch (e) {
      announceNotSaved(e);
    } finally {
      guard.current.finish();
      timer.current = setTimeout(() => setResting(false), Math.max(0, REPEAT_TAP_WINDOW_MS - (performance.now() - at)));
    }
  }

  return { resting, tap, ignoresTapAt: (nowMs: number) => guard.current.resting(nowMs) };
}
