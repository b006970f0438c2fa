"use client";

import { useState } from "react";
import { signOutTo } from "@/lib/client/sign-out";
import { clearUserCaches } from "@/lib/client/worker-caches";

// Signing out clears the pages the service worker kept for this user (the tablet's unsent bench
// work in IndexedDB stays, to be sent when that user signs in again). If the server does not
// answer (offline), the page says so and stays: the session still stands, and so do the kept pages
// (the bench still opens offline).
export function SignOutButton() {
  const [failed, setFailed] = useState(false);
  return (
    <span className="flex items-center gap-2">
      {failed && (
        <span role="alert" className="text-sm font-bold text-white">
          ⚠ Not signed out: no answer from the server. Try again online.
        </span>
      )}
      <button
        type="button"
        onClick={async () => {
          setFailed(false);
          const to = await signOutTo("/signin").catch(() => null);
          if (!to) return setFailed(true);
          // only once the server has ended the session: offline, the bench page stays kept for this user
          await clearUserCaches().catch(() => undefined);
          window.location.href = to;
        }}
        className="min-h-12 rounded-lg border-2 border-white px-4 text-base font-bold text-white"
      >
        Sign out
      </button>
    </span>
  );
}
