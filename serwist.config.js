// Serwist in configurator mode: `next build` then `serwist build` writes public/sw.js.
import { generateGlobPatterns, serwist } from "@serwist/next/config";
import { onlyBenchChunks } from "./sw/bench-precache.mjs";

export default await serwist({
  swSrc: "sw/sw.ts",
  swDest: "public/sw.js",
  precachePrerendered: true,
  // The default patterns, plus the fonts shipped in fonts/ (next/font/local puts them in static/media),
  // so the bench reads the same offline.
  globPatterns: [...generateGlobPatterns(".next/"), ".next/static/media/*.woff2"],
  // Only the bench's own chunks (sw/bench-precache.mjs): the office's pages are never opened offline;
  // the app icons are kept at run time, not precached.
  manifestTransforms: [onlyBenchChunks(".next")],
});
