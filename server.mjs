// Benchtag's production server: Next.js inside a small Node http server that stamps every request
// with the address of its TCP connection (header x-benchtag-peer, replacing any the client sent).
// Next passes route handlers no connection address, and keeps a client's own X-Forwarded-For, so
// without this stamp the sign-in waits could not tell clients apart unless a proxy is trusted
// (TRUSTED_PROXY_HOPS; app/_server/client-address.ts). Started by `npm start`, `npm run serve`
// and the browser tests' server (tests/e2e/serve.sh). Production settings are checked by
// instrumentation.ts before it serves anything.
import { writeFileSync } from "node:fs";
import http from "node:http";
import next from "next";

const port = Number(process.env.PORT ?? 3000);
const hostname = process.env.HOST || undefined;
globalThis[Symbol.for("benchtag.peer-stamped")] = true;

const app = next({ dev: false, dir: import.meta.dirname, port, hostname: hostname ?? "localhost" });
const handle = app.getRequestHandler();
await app.prepare();

// An address whose %-escapes do not decode to text (a cut-off "%E0%A4", half of an emoji) is
// answered here, in words: Next fails on it while reading the path's values, as a server error.
// An API route gets the one error body; a page, a page that says the same and leads home.
const BROKEN = "This address is not valid: part of it is a broken %-escape. Check the link.";
const BROKEN_JSON = JSON.stringify({ error: BROKEN, issues: [] });
const BROKEN_PAGE = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>Address not valid · Benchtag</title></head><body><h1>Address not valid</h1><p>${BROKEN}</p><p><a href="/">Go to Benchtag's start page</a></p></body></html>`;
function pathDecodes(path) {
  try {
    decodeURIComponent(path);
    return true;
  } catch {
    return false;
  }
}

const server = http.createServer((req, res) => {
  const path = (req.url ?? "/").split("?")[0];
  if (!pathDecodes(path)) {
    const api = path.startsWith("/api/");
    res.writeHead(400, {
      "content-type": api ? "application/json; charset=utf-8" : "text/html; charset=utf-8",
      "cache-control": "no-store",
      "content-security-policy": "default-src 'none'; frame-ancestors 'none'",
      "x-content-type-options": "nosniff",
    });
    res.end(api ? BROKEN_JSON : BROKEN_PAGE);
    return;
  }
  req.headers["x-benchtag-peer"] = req.socket.remoteAddress ?? "";
  void handle(req, res);
});
server.listen(port, hostname, () => {
  if (process.env.BENCHTAG_PID_FILE) writeFileSync(process.env.BENCHTAG_PID_FILE, String(process.pid));
  console.log(`[benchtag] serving on http://${hostname ?? "localhost"}:${port}`);
});
for (const signal of ["SIGINT", "SIGTERM"]) process.on(signal, () => server.close(() => process.exit(0)));
