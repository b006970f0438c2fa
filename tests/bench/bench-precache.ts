// What the service worker precaches for the bench, against every script and style the build made
// (issue target: the precache at most 40 % of the whole). Reads the built files, so run it after
// `npm run build`. Also prints the bench's first-load scripts gzipped, the figure the first load
// of a tablet pays on the network. Figures only: nothing passes or fails on them.
import fs from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";
// @ts-expect-error -- build-time helper in plain JavaScript, no type declarations
import { benchChunkSet, benchEntryFiles } from "../../sw/bench-precache.mjs";

const DIST = ".next";

interface PrecacheFigures {
  allChunkBytes: number;
  precacheChunkBytes: number;
  precacheChunks: number;
  allChunks: number;
  firstLoadJsGzip: number;
  /** Of the first load: the scripts every page of the app boots with (React, the Next.js runtime). */
  bootJsGzip: number;
  /** The bench's own code, fetched right after the first paint (IndexedDB, sync, validation, screens), without the scanner. */
  afterPaintJsGzip: number;
  /** The precache by part, raw bytes: boot scripts, the QR scanner's chunk, the bench's other scripts, styles. */
  parts: { boot: number; scanner: number; bench: number; styles: number };
}

// The QR scanner's chunk (html5-qrcode and the ZXing decoder it bundles), loaded when the scan screen opens.
const isScanner = (text: string) => text.includes("MultiFormatReader");

export function run(): PrecacheFigures | null {
  const chunkDir = path.join(DIST, "static/chunks");
  if (!fs.existsSync(path.join(DIST, "server/app/bench/page_client-reference-manifest.js"))) return null;
  const all = fs.readdirSync(chunkDir).filter((f) => /\.(js|css)$/.test(f));
  const size = (f: string) => fs.statSync(path.join(DIST, f)).size;
  const bench = [...(benchChunkSet(DIST) as Set<string>)];
  // first load: the bench's scripts without those it loads on demand (the scanner)
  const firstLoad = (benchEntryFiles(DIST) as string[]).filter((f) => f.endsWith(".js"));
  const boot = new Set<string>(JSON.parse(fs.readFileSync(path.join(DIST, "build-manifest.json"), "utf8")).rootMainFiles ?? []);
  const gzipped = (files: string[]) => files.reduce((n, f) => n + gzipSync(fs.readFileSync(path.join(DIST, f))).length, 0);
  const scanner = bench.filter((f) => f.endsWith(".js") && isScanner(fs.readFileSync(path.join(DIST, f), "utf8")));
  const afterPaint = bench.filter((f) => f.endsWith(".js") && !firstLoad.includes(f) && !scanner.includes(f));
  const sum = (files: string[]) => files.reduce((n, f) => n + size(f), 0);
  return {
    allChunkBytes: all.reduce((n, f) => n + size(`static/chunks/${f}`), 0),
    allChunks: all.length,
    precacheChunkBytes: bench.reduce((n, f) => n + size(f), 0),
    precacheChunks: bench.length,
    firstLoadJsGzip: gzipped(firstLoad),
    bootJsGzip: gzipped(firstLoad.filter((f) => boot.has(f))),
    afterPaintJsGzip: gzipped(afterPaint),
    parts: {
      boot: sum(bench.filter((f) => boot.has(f))),
      scanner: sum(scanner),
      bench: sum(bench.filter((f) => f.endsWith(".js") && !boot.has(f) && !scanner.includes(f))),
      styles: sum(bench.filter((f) => f.endsWith(".css"))),
    },
  };
}

export function print(f: PrecacheFigures | null): void {
  if (!f) {
    console.log("no build found: run `npm run build` first");
    return;
  }
  const kb = (n: number) => `${(n / 1024).toFixed(0)} kB`;
  console.log(
    `Precached scripts and styles: ${f.precacheChunks} of ${f.allChunks} chunks, ${kb(f.precacheChunkBytes)} of ${kb(f.allChunkBytes)} ` +
      `(${((100 * f.precacheChunkBytes) / f.allChunkBytes).toFixed(0)} % of the whole; target at most 40 %)`,
  );
  console.log(
    `  of which: React and the Next.js runtime ${kb(f.parts.boot)}, the QR scanner ${kb(f.parts.scanner)}, ` +
      `the bench's own scripts ${kb(f.parts.bench)} (its code, dexie, zod, react-query), styles ${kb(f.parts.styles)}`,
  );
  console.log(`Bench first-load scripts, gzipped: ${kb(f.firstLoadJsGzip)} (target at most 150 kB)`);
  console.log(
    `  of which ${kb(f.bootJsGzip)} is what every page of the app boots with (React, the Next.js runtime), ` +
      `${kb(f.firstLoadJsGzip - f.bootJsGzip)} the bench's shell (its first screen and keypad, already in the server's HTML)`,
  );
  console.log(
    `Then, right after the first paint, the bench's own code: ${kb(f.afterPaintJsGzip)} gzipped (IndexedDB, sync, validation, every screen; ` +
      `precached, so a tablet takes it from the worker), and the QR scanner when the scan screen opens`,
  );
}
