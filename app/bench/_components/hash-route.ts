"use client";

import { useEffect, useState } from "react";

// The bench is one page; its screens live in the URL hash (#/job/<id>/step/<n>) so the page the
// service worker keeps opens any screen offline.
export type BenchRoute =
  | { screen: "home" }
  | { screen: "scan" }
  | { screen: "not-stored" }
  | { screen: "job"; jobId: string }
  | { screen: "step"; jobId: string; stepIndex: number };

export function parseRoute(hash: string): BenchRoute {
  const parts = hash.replace(/^#\/?/, "").split("/").filter(Boolean);
  if (parts[0] === "scan") return { screen: "scan" };
  if (parts[0] === "not-stored") return { screen: "not-stored" };
  if (parts[0] === "job" && parts[1]) {
    if (parts[2] === "step" && parts[3] && /^\d+$/.test(parts[3])) return { screen: "step", jobId: parts[1], stepIndex: Number(parts[3]) };
    return { screen: "job", jobId: parts[1] };
  }
  return { screen: "home" };
}

export function routeHref(r: BenchRoute): string {
  switch (r.screen) {
    case "home":
      return "#/";
    case "scan":
      return "#/scan";
    case "not-stored":
      return "#/not-stored";
    case "job":
      return `#/job/${r.jobId}`;
    case "step":
      return `#/job/${r.jobId}/step/${r.stepIndex}`;
  }
}

export function go(r: BenchRoute): void {
  window.location.hash = routeHref(r);
}

/** The screen now, to hand to `goFrom` when an action that ends by moving on begins. */
export function currentScreen(): string {
  return window.location.hash;
}

/**
 * Goes to `r` only while the screen is still `from` (`currentScreen()` when the action began): a
 * save or a tag lookup that finishes after the mechanic has moved on never pulls them back.
 */
export function goFrom(from: string, r: BenchRoute): void {
  if (window.location.hash === from) go(r);
}

export function useHashRoute(): BenchRoute {
  const [route, setRoute] = useState<BenchRoute>({ screen: "home" });
  useEffect(() => {
    const update = () => setRoute(parseRoute(window.location.hash));
    update();
    window.addEventListener("hashchange", update);
    return () => window.removeEventListener("hashchange", update);
  }, []);
  return route;
}
