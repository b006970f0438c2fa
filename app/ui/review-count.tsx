"use client";

import { useEffect, useState } from "react";

/** Sent on window by screens that change the review queue (a decision), so the count refreshes at once. */
export const REVIEW_COUNT_EVENT = "benchtag:review-queue-changed";

// How many sign-offs wait for review, shown beside the Review link; refreshed every 30 s, when the
// tab comes back into view, and after a decision.
export function ReviewCount() {
  const [waiting, setWaiting] = useState<number | null>(null);
  useEffect(() => {
    let live = true;
    const load = async () => {
      try {
        const res = await fetch("/api/review/count", { cache: "no-store" });
        if (!res.ok) return;
        const body = (await res.json()) as { waiting?: unknown };
        if (live && typeof body.waiting === "number") setWaiting(body.waiting);
      } catch {
        // offline or signed out: keep the last figure
      }
    };
    void load();
    const timer = setInterval(load, 30_000);
    const onVisible = () => document.visibilityState === "visible" && void load();
    window.addEventListener(REVIEW_COUNT_EVENT, load);
    document.addEventListener("visibilitychange", onVisible);
    return () => {
      live = false;
      clearInterval(timer);
      window.removeEventListener(REVIEW_COUNT_EVENT, load);
      document.removeEventListener("visibilitychange", onVisible);
    };
  }, []);
  if (waiting === null) return null;
  return (
    <span
      data-testid="review-count"
      className={`ml-2 inline-flex min-w-7 items-center justify-center rounded-full border-2 px-2 text-sm font-bold ${waiting > 0 ? "border-ink bg-white text-ink" : "border-current"}`}
    >
      {waiting}
      <span className="sr-only"> waiting for review</span>
    </span>
  );
}
