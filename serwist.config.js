// Serwist in configurator mode: `next build` then `serwist build` writes public/sw.js.
import { generateGlobPatterns, serwist } from "@serwist/next/config";

export default await serwist({
  swSrc: "sw/sw.ts",
  swDest: "public/sw.js",
  precachePrerendered: true,
  // The default patterns, plus the fonts shipped in fonts/ (next/font/local puts them in static/media),
  // so the bench reads the same offline.
  globPatterns: [...generateGlobPatterns(".next/"), ".next/static/media/*.woff2"],
});
