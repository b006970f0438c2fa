"use client";

import { useState } from "react";
import { signOutTo, unsentOnThisTablet } from "@/lib/client/sign-out";
import { clearUserCaches } from "@/lib/client/worker-caches";

// Signing out clears the pages the service worker kept for this user (the tablet's unsent bench
// work in IndexedDB stays, to be sent when that user signs in again). On the bench, work not yet
// sent is named first and the person chooses: it stays on this tablet, and only their next
// sign-in here sends it. If the server does not answer (offline), the page says so and stays: the
// session still stands, and so do the kept pages (the bench still opens offline).
export function SignOutButton() {
  const [failed, setFailed] = useState(false);
  const [unsent, setUnsent] = useState(0);

  async function signOut() {
    setFailed(false);
    setUnsent(0);
    const to = await signOutTo("/signin").catch(() => null);
    if (!to) return setFailed(true);
    // only once the server has ended the session: offline, the bench page stays kept for this user
    await clearUserCaches().catch(() => undefined);
    window.location.href = to;
  }

  return (
    <span className="flex items-center gap-2">
      {failed && (
        <span role="alert" className="text-sm font-bold text-white">
          ⚠ Not signed out: no answer from the server. Try again online.
        </span>
      )}
      {unsent > 0 ? (
        <span
          role="alertdialog"
          aria-label="Work not sent yet"
          className="flex flex-wrap items-center gap-2 rounded-lg bg-white p-2 text-ink"
        >
          <span className="max-w-md text-base font-bold" data-testid="unsent-before-sign-out">
            {unsent === 1 ? "1 piece of work on this tablet is" : `${unsent} pieces of work on this tablet are`} not with the server yet. It
            stays here and is sent only when you sign in on this tablet again.
          </span>
          <button
            type="button"
            onClick={() => setUnsent(0)}
            className="min-h-12 rounded-lg border-2 border-steel-900 px-4 text-base font-bold"
          >
            Stay signed in
          </button>
          <button
            type="button"
            onClick={() => void signOut()}
            className="min-h-12 rounded-lg border-2 border-fail bg-fail px-4 text-base font-bold text-white"
          >
            Sign out anyway
          </button>
        </span>
      ) : (
        <button
          type="button"
          onClick={async () => {
            const waiting = await unsentOnThisTablet();
            if (waiting > 0) setUnsent(waiting);
            else await signOut();
          }}
          className="min-h-12 rounded-lg border-2 border-white px-4 text-base font-bold text-white"
        >
          Sign out
        </button>
      )}
    </span>
  );
}
