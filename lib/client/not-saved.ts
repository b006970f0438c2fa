/**
 * A write to the tablet's own store that failed: the work was not saved, and the mechanic must be
 * told so at once (the screen stays truthful — it draws only what was stored — but a silent
 * failure reads as "saved"). A control whose save failed calls `announceNotSaved`; the bench's
 * notice (`app/bench/_components/not-saved-notice.tsx`) says it in workshop words
 * (`./not-saved-words.ts`) and also catches a failed store write that no control handled.
 * Kept free of zod and dexie: the bench's first screen (its buttons) loads this module.
 */

export const NOT_SAVED_EVENT = "benchtag:not-saved";

/** The names an IndexedDB failure comes by (the browser's, or dexie's for the same thing), at any depth of `inner`/`cause`. */
function failureNames(e: unknown, depth = 0): string[] {
  if (!e || typeof e !== "object" || depth > 4) return [];
  const o = e as { name?: unknown; inner?: unknown; cause?: unknown };
  return [typeof o.name === "string" ? o.name : "", ...failureNames(o.inner, depth + 1), ...failureNames(o.cause, depth + 1)];
}

const CLOSED = new Set(["DatabaseClosedError", "VersionError", "InvalidStateError", "OpenFailedError", "TransactionInactiveError"]);
const STORE_TROUBLE = new Set(["QuotaExceededError", "AbortError", "UnknownError", "ReadOnlyError", "DataCloneError", ...CLOSED]);

/** Is this a failure of the tablet's store (rather than, say, a network error the sync handles)? */
export function isStoreFailure(e: unknown): boolean {
  return failureNames(e).some((n) => STORE_TROUBLE.has(n));
}

/** Why the store did not save it, in workshop words; null when the failure is not the store's. */
export function storeFailureMessage(e: unknown): string | null {
  const names = failureNames(e);
  if (names.includes("QuotaExceededError")) {
    return "Not saved: this tablet's storage is full. Press Sync now so photos already sent can be cleared, or free space on the tablet, then record it again.";
  }
  if (names.some((n) => CLOSED.has(n))) {
    return "Not saved: the bench's store on this tablet was closed (the app was updated or opened in another tab). Reload the bench, then record it again.";
  }
  if (isStoreFailure(e))
    return "Not saved: the tablet could not write it to its storage. Record it again; if it keeps failing, reload the bench.";
  return null;
}

/** Tells the bench's notice that a piece of work was not saved (the error says why). */
export function announceNotSaved(e: unknown): void {
  if (typeof window === "undefined") return;
  window.dispatchEvent(new CustomEvent<unknown>(NOT_SAVED_EVENT, { detail: e }));
}
