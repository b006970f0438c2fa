// Serwist in configurator mode: `next build` then `serwist build` writes public/sw.js.
import { serwist } from "@serwist/next/config";

export default await serwist({
  swSrc: "sw/sw.ts",
  swDest: "public/sw.js",
  precachePrerendered: true,
});
