"use client";

import { useCallback, useEffect, useState } from "react";

// The bench's palette, chosen per tablet and kept in localStorage: "bright" (the workshop palette)
// or "dim" (light on dark, for a dark corner of the bay; app/globals.css [data-bay="dim"]).
export type BayLight = "bright" | "dim";

const KEY = "benchtag-bay-light";

export function useBayLight(): [BayLight, () => void] {
  const [light, setLight] = useState<BayLight>("bright");
  useEffect(() => {
    if (localStorage.getItem(KEY) === "dim") setLight("dim");
  }, []);
  const toggle = useCallback(() => {
    setLight((l) => {
      const next = l === "dim" ? "bright" : "dim";
      localStorage.setItem(KEY, next);
      return next;
    });
  }, []);
  return [light, toggle];
}
