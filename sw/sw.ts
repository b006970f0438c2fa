/// <reference lib="webworker" />
import { defaultCache } from "@serwist/next/worker";
import type { PrecacheEntry, SerwistGlobalConfig } from "serwist";
import { NetworkFirst, Serwist } from "serwist";

declare global {
  interface WorkerGlobalScope extends SerwistGlobalConfig {
    __SW_MANIFEST: (PrecacheEntry | string)[] | undefined;
  }
}
declare const self: ServiceWorkerGlobalScope;

// Bench pages: fresh from the network when it answers within 3 s, else the copy kept from the
// last visit, so the bench opens with the Wi-Fi off. Only plain 200 answers are kept (never a
// redirect to sign-in).
const benchPages = new NetworkFirst({
  cacheName: "bench-pages",
  networkTimeoutSeconds: 3,
  plugins: [
    {
      cacheWillUpdate: async ({ response }) => (response.status === 200 && !response.redirected ? response : null),
    },
  ],
});

const serwist = new Serwist({
  precacheEntries: self.__SW_MANIFEST,
  // A new worker waits until the page asks it to take over (the page shows "new version ready").
  skipWaiting: false,
  clientsClaim: true,
  navigationPreload: true,
  runtimeCaching: [
    {
      matcher: ({ request, url, sameOrigin }) => sameOrigin && request.mode === "navigate" && url.pathname.startsWith("/bench"),
      handler: benchPages,
    },
    ...defaultCache,
  ],
  fallbacks: {
    entries: [{ url: "/offline", matcher: ({ request }) => request.destination === "document" }],
  },
});

self.addEventListener("message", (event) => {
  if (event.data?.type === "SKIP_WAITING") void self.skipWaiting();
});

serwist.addEventListeners();
