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
  /** Every entry of the worker's precache list (scripts, styles, fonts, the offline page), raw bytes, and how many. */
  listBytes: number;
  listEntries: number;
}

// The precache when issue 17 was filed, as `serwist build` printed it then ("2.29 MB", decimal units):
// the fixed "today's bytes" its 40 % target is counted against.
const PRECACHE_WHEN_FILED = 2.29e6;

/** The worker's precache list as built (public/sw.js), each entry's file size: the figure `serwist build` prints. */
function precacheList(): { bytes: number; entries: number } | null {
  if (!fs.existsSync("public/sw.js")) return null;
  const urls = new Set(
    [...fs.readFileSync("public/sw.js", "utf8").matchAll(/\{revision:[^{}]*?url:"([^"]+)"\}|\{url:"([^"]+)",revision:[^{}]*?\}/g)].map(
      (m) => m[1] ?? m[2],
    ),
  );
  let bytes = 0;
  for (const url of urls) {
    const file = url.startsWith("/_next/")
      ? path.join(DIST, url.slice("/_next/".length))
      : fs.existsSync(path.join("public", url))
        ? path.join("public", url)
        : path.join(DIST, "server/app", `${url}.html`);
    bytes += fs.statSync(file).size;
  }
  return { bytes, entries: urls.size };
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
  const list = precacheList();
  return {
    listBytes: list?.bytes ?? 0,
    listEntries: list?.entries ?? 0,
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
  const mb = (n: number) => `${(n / 1e6).toFixed(2)} MB`;
  console.log(
    `The worker's whole precache list: ${f.listEntries} entries, ${mb(f.listBytes)} (scripts, styles, fonts, the offline page), ` +
      `${((100 * f.listBytes) / PRECACHE_WHEN_FILED).toFixed(0)} % of the ${mb(PRECACHE_WHEN_FILED)} precached when issue 17 was filed (target at most 40 %)`,
  );
  console.log(
    `Precached scripts and styles: ${f.precacheChunks} of ${f.allChunks} chunks, ${kb(f.precacheChunkBytes)} of ${kb(f.allChunkBytes)} ` +
      `(${((100 * f.precacheChunkBytes) / f.allChunkBytes).toFixed(0)} % of every script and style of this build)`,
  );
  console.log(
    `  of which: React and the Next.js runtime ${kb(f.parts.boot)}, the QR scanner ${kb(f.parts.scanner)}, ` +
      `the bench's own scripts ${kb(f.parts.bench)} (its code, dexie, zod), styles ${kb(f.parts.styles)}`,
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
