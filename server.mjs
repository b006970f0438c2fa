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
const BROKEN_ADDRESS = JSON.stringify({ error: "This address is not valid: part of it is a broken %-escape. Check the link.", issues: [] });
function pathDecodes(url = "/") {
  try {
    decodeURIComponent(url.split("?")[0]);
    return true;
  } catch {
    return false;
  }
}

const server = http.createServer((req, res) => {
  if (!pathDecodes(req.url)) {
    res.writeHead(400, {
      "content-type": "application/json; charset=utf-8",
      "cache-control": "no-store",
      "content-security-policy": "default-src 'none'; frame-ancestors 'none'",
      "x-content-type-options": "nosniff",
    });
    res.end(BROKEN_ADDRESS);
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
