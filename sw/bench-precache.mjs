// What the service worker precaches: the bench's own files, not the whole app's. Read after
// `next build`: the bench page's entry scripts and styles (its client reference manifest), the
// scripts every page boots with (build manifest), and every chunk those load later by name (the
// QR scanner's chunk is loaded on demand), found by following "static/chunks/…" names through the
// chunks' text. Office, review and chart code is left out: those pages are never opened offline,
// and a page that is opened online still keeps its scripts in the worker's runtime cache.
import fs from "node:fs";
import path from "node:path";
import vm from "node:vm";

const CHUNK_NAME = /static\/chunks\/[A-Za-z0-9_\-.]+\.(?:js|css)/g;

/** The files the bench page loads first, as paths below the build folder ("static/chunks/…"): scripts every page boots with, then the page's own scripts and styles. */
export function benchEntryFiles(distDir = ".next") {
  const manifestFile = path.join(distDir, "server/app/bench/page_client-reference-manifest.js");
  const sandbox = { globalThis: {} };
  sandbox.self = sandbox.globalThis;
  vm.runInNewContext(fs.readFileSync(manifestFile, "utf8"), sandbox);
  const page = sandbox.globalThis.__RSC_MANIFEST?.["/bench/page"];
  if (!page) throw new Error(`${manifestFile} has no entry for the bench page`);
  const boot = JSON.parse(fs.readFileSync(path.join(distDir, "build-manifest.json"), "utf8")).rootMainFiles ?? [];
  const css = Object.values(page.entryCSSFiles ?? {})
    .flat()
    .map((c) => c.path);
  return [...new Set([...boot, ...Object.values(page.entryJSFiles ?? {}).flat(), ...css])];
}

/** The bench page's files and everything they load by name, as paths below the build folder ("static/chunks/…"). */
export function benchChunkSet(distDir = ".next") {
  const start = benchEntryFiles(distDir);
  const found = new Set();
  const queue = [...start];
  while (queue.length) {
    const file = queue.pop();
    if (found.has(file)) continue;
    found.add(file);
    if (!file.endsWith(".js")) continue;
    for (const m of fs.readFileSync(path.join(distDir, file), "utf8").matchAll(CHUNK_NAME)) if (!found.has(m[0])) queue.push(m[0]);
  }
  return found;
}

/** Precache entries the bench does not need offline: the app icons (public/icons/) serve installing the app and the tab's icon; the worker keeps them at run time once fetched (sw/sw.ts). */
const NOT_FOR_OFFLINE = /^(?:public\/|\/)?icons\//;

/** A serwist manifest transform: chunks outside the bench's set and the app icons are not precached; other entries stay. */
export function onlyBenchChunks(distDir = ".next") {
  return (entries) => {
    const keep = benchChunkSet(distDir);
    const prefix = `${distDir.replace(/\/$/, "")}/`;
    const manifest = entries.filter((e) => {
      const file = e.url.startsWith(prefix) ? e.url.slice(prefix.length) : e.url;
      if (NOT_FOR_OFFLINE.test(file)) return false;
      return !file.startsWith("static/chunks/") || keep.has(file);
    });
    return { manifest, warnings: [] };
  };
}
