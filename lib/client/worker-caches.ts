/**
 * The service worker's caches that can hold a signed-in user's data, and clearing them on
 * sign-out. The worker keeps no answer of `/api/` at all (`sw/sw.ts`); the only copies of a user's
 * data it keeps are the bench pages (the page carries the user's name and id). Static files,
 * scripts and fonts hold nobody's data and stay.
 *
 * The tablet's IndexedDB (the outbox of unsent work, job copies) is never touched here: unsent
 * work must survive a sign-out and is sent when that user signs in again.
 */

/** Caches of this worker version that hold a user's pages. */
export const USER_DATA_CACHES = ["bench-pages"] as const;

/**
 * Caches earlier worker versions kept with the library's default runtime caching (API answers,
 * visited pages and page data): deleted when this worker takes over and again at sign-out.
 */
export const RETIRED_CACHES = [
  "apis",
  "pages",
  "pages-rsc",
  "pages-rsc-prefetch",
  "others",
  "next-data",
  "static-data-assets",
  "cross-origin",
] as const;

export const SIGNED_OUT_MESSAGE = "SIGNED_OUT";

export async function deleteCaches(storage: CacheStorage, names: readonly string[]): Promise<void> {
  await Promise.all(names.map((n) => storage.delete(n)));
}

/** From the page, at sign-out: clears the user's cached pages and tells the worker to do the same. */
export async function clearUserCaches(): Promise<void> {
  if (typeof caches !== "undefined") await deleteCaches(caches, [...USER_DATA_CACHES, ...RETIRED_CACHES]);
  navigator.serviceWorker?.controller?.postMessage({ type: SIGNED_OUT_MESSAGE });
}
