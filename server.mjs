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

const server = http.createServer((req, res) => {
  req.headers["x-benchtag-peer"] = req.socket.remoteAddress ?? "";
  void handle(req, res);
});
server.listen(port, hostname, () => {
  if (process.env.BENCHTAG_PID_FILE) writeFileSync(process.env.BENCHTAG_PID_FILE, String(process.pid));
  console.log(`[benchtag] serving on http://${hostname ?? "localhost"}:${port}`);
});
for (const signal of ["SIGINT", "SIGTERM"]) process.on(signal, () => server.close(() => process.exit(0)));
