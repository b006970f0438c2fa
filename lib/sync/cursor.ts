/**
 * Comparing the server's change cursors (decimal sequence numbers, see `cursorSchema`). A job copy
 * carries the cursor it is current to; a copy is never replaced by one with a lower cursor. Pure.
 */

/** Negative when `a` is before `b`, 0 when equal, positive when after. */
export function compareCursors(a: string, b: string): number {
  const x = BigInt(a);
  const y = BigInt(b);
  return x < y ? -1 : x > y ? 1 : 0;
}

/** Whether a copy current to `copy` is at least as new as `wanted` (no copy: never). */
export function isAtLeast(copy: string | null | undefined, wanted: string): boolean {
  return copy != null && compareCursors(copy, wanted) >= 0;
}

export function laterCursor(a: string | null | undefined, b: string): string {
  return a != null && compareCursors(a, b) > 0 ? a : b;
}
