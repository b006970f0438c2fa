"use client";

import { signOut } from "next-auth/react";
import { clearUserCaches } from "@/lib/client/worker-caches";

// Signing out clears the pages the service worker kept for this user (the tablet's unsent bench
// work in IndexedDB stays, to be sent when that user signs in again).
export function SignOutButton() {
  return (
    <button
      type="button"
      onClick={async () => {
        await clearUserCaches().catch(() => undefined);
        await signOut({ callbackUrl: "/signin" });
      }}
      className="min-h-12 rounded-lg border-2 border-white px-4 text-base font-bold text-white"
    >
      Sign out
    </button>
  );
}
