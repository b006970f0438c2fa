"use client";

import { useEffect, useState } from "react";
import { isStoreFailure, NOT_SAVED_EVENT } from "@/lib/client/not-saved";
import { notSavedText } from "@/lib/client/not-saved-words";

/**
 * "Not saved" across the top of the bench: a control whose save failed says so here
 * (`announceNotSaved`), and so does any failed write to the tablet's store that no control
 * handled. It stays until the mechanic has read it.
 */
export function NotSavedNotice() {
  const [message, setMessage] = useState<string | null>(null);
  useEffect(() => {
    const onAnnounced = (e: Event) => setMessage(notSavedText((e as CustomEvent<unknown>).detail));
    const onUnhandled = (e: PromiseRejectionEvent) => {
      if (!isStoreFailure(e.reason)) return;
      e.preventDefault();
      setMessage(notSavedText(e.reason));
    };
    window.addEventListener(NOT_SAVED_EVENT, onAnnounced);
    window.addEventListener("unhandledrejection", onUnhandled);
    return () => {
      window.removeEventListener(NOT_SAVED_EVENT, onAnnounced);
      window.removeEventListener("unhandledrejection", onUnhandled);
    };
  }, []);
  if (!message) return null;
  return (
    <div
      role="alert"
      data-testid="not-saved"
      className="flex flex-wrap items-center gap-4 border-y-4 border-fail bg-fail-light px-6 py-3 text-xl font-bold text-fail"
    >
      <p className="flex-1">
        <span aria-hidden="true">✖ </span>
        {message}
      </p>
      <button
        type="button"
        onClick={() => setMessage(null)}
        className="min-h-target rounded-lg border-4 border-fail bg-white px-5 text-lg text-fail"
      >
        Read it
      </button>
    </div>
  );
}
