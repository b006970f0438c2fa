/// <reference lib="webworker" />
import type { PrecacheEntry, RuntimeCaching, SerwistGlobalConfig } from "serwist";
import { CacheFirst, ExpirationPlugin, NetworkFirst, NetworkOnly, Serwist, StaleWhileRevalidate } from "serwist";
import { deleteCaches, RETIRED_CACHES, SIGNED_OUT_MESSAGE, USER_DATA_CACHES } from "../lib/client/worker-caches";

declare global {
  interface WorkerGlobalScope extends SerwistGlobalConfig {
    __SW_MANIFEST: (PrecacheEntry | string)[] | undefined;
  }
}
declare const self: ServiceWorkerGlobalScope;

const DAY_S = 24 * 60 * 60;
const isApi = (url: URL) => url.pathname.startsWith("/api/");

// Bench pages: fresh from the network when it answers within 3 s, else the copy kept from the
// last visit, so the bench opens with the Wi-Fi off. Only plain 200 answers are kept (never a
// redirect to sign-in). Cleared at sign-out (lib/client/worker-caches.ts).
const benchPages = new NetworkFirst({
  cacheName: USER_DATA_CACHES[0],
  networkTimeoutSeconds: 3,
  plugins: [
    {
      cacheWillUpdate: async ({ response }) => (response.status === 200 && !response.redirected ? response : null),
    },
  ],
});

// What the worker keeps beyond the precache: the bench page, and static files that hold nobody's
// data (hashed scripts and styles, fonts, icons). Nothing under /api/ is ever answered from a
// cache: no route below matches it, so the browser asks the network and a failure is a failure
// (the tablet then keeps drawing its own copy and its waiting work).
const runtimeCaching: RuntimeCaching[] = [
  {
    matcher: ({ request, url, sameOrigin }) => sameOrigin && request.mode === "navigate" && url.pathname.startsWith("/bench"),
    handler: benchPages,
  },
  {
    matcher: ({ url, sameOrigin }) => sameOrigin && url.pathname.startsWith("/_next/static/"),
    handler: new CacheFirst({
      cacheName: "next-static",
      plugins: [new ExpirationPlugin({ maxEntries: 200, maxAgeSeconds: 30 * DAY_S, maxAgeFrom: "last-used" })],
    }),
  },
  {
    matcher: ({ url, sameOrigin }) => sameOrigin && !isApi(url) && /\.(?:woff2?|ttf|otf)$/i.test(url.pathname),
    handler: new StaleWhileRevalidate({
      cacheName: "static-font-assets",
      plugins: [new ExpirationPlugin({ maxEntries: 16, maxAgeSeconds: 30 * DAY_S })],
    }),
  },
  {
    matcher: ({ url, sameOrigin }) => sameOrigin && !isApi(url) && url.pathname.startsWith("/icons/"),
    handler: new StaleWhileRevalidate({
      cacheName: "static-image-assets",
      plugins: [new ExpirationPlugin({ maxEntries: 32, maxAgeSeconds: 30 * DAY_S })],
    }),
  },
  {
    // Other pages: never kept (they hold customers' and users' data); offline they fall back to /offline.
    matcher: ({ request, url, sameOrigin }) => sameOrigin && request.mode === "navigate" && !isApi(url),
    handler: new NetworkOnly(),
  },
];

const serwist = new Serwist({
  precacheEntries: self.__SW_MANIFEST,
  // A new worker waits until the page asks it to take over (the page shows "new version ready").
  skipWaiting: false,
  clientsClaim: true,
  navigationPreload: true,
  runtimeCaching,
  fallbacks: {
    entries: [{ url: "/offline", matcher: ({ request }) => request.destination === "document" }],
  },
});

// Caches an earlier worker filled with API answers and pages go when this one takes over.
self.addEventListener("activate", (event) => {
  event.waitUntil(deleteCaches(self.caches, RETIRED_CACHES));
});

self.addEventListener("message", (event) => {
  if (event.data?.type === "SKIP_WAITING") void self.skipWaiting();
  if (event.data?.type === SIGNED_OUT_MESSAGE) event.waitUntil(deleteCaches(self.caches, [...USER_DATA_CACHES, ...RETIRED_CACHES]));
});

serwist.addEventListeners();
