import { readFileSync } from "node:fs";
import http from "node:http";
import path from "node:path";
import type { APIRequestContext, BrowserContext } from "@playwright/test";

// Helpers of the security browser tests: signing in through next-auth's own endpoints (as the
// sign-in form does), the server's memory, and streaming large bodies at it.

export const E2E_PORT = Number(process.env.E2E_PORT ?? 3100);

/** One HTTP exchange from a chosen loopback address (the server sees it as the client's address). */
function exchange(
  from: string,
  url: string,
  init: { method?: string; headers?: Record<string, string>; body?: string },
): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: string }> {
  return new Promise((resolve, reject) => {
    const req = http.request(url, { method: init.method ?? "GET", headers: init.headers, localAddress: from }, (res) => {
      const chunks: Buffer[] = [];
      res.on("data", (c: Buffer) => chunks.push(c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks).toString("utf8") }));
    });
    req.on("error", reject);
    req.end(init.body);
  });
}

/**
 * Signs in with e-mail and password the way the sign-in form does (next-auth's CSRF token, then
 * its credentials callback), from the loopback address `from` (127.0.0.2, 127.0.0.3, …: each a
 * different client to the server). The error is our message, as next-auth passes it on.
 */
export async function signInFrom(
  from: string,
  email: string,
  password: string,
  headers: Record<string, string> = {},
): Promise<{ ok: boolean; error: string | null; cookie: string }> {
  const origin = `http://localhost:${E2E_PORT}`;
  const csrf = await exchange(from, `${origin}/api/auth/csrf`, {});
  const jar = (set: http.IncomingHttpHeaders["set-cookie"]) => (set ?? []).map((c) => c.split(";")[0]);
  const cookies = jar(csrf.headers["set-cookie"]);
  const { csrfToken } = JSON.parse(csrf.body) as { csrfToken: string };
  const res = await exchange(from, `${origin}/api/auth/callback/credentials`, {
    method: "POST",
    headers: { origin, "content-type": "application/x-www-form-urlencoded", cookie: cookies.join("; "), ...headers },
    body: new URLSearchParams({ email, password, csrfToken, json: "true", callbackUrl: `${origin}/` }).toString(),
  });
  const body = JSON.parse(res.body || "{}") as { url?: string };
  const error = body.url ? new URL(body.url).searchParams.get("error") : `status ${res.status}`;
  return { ok: res.status < 400 && !error, error, cookie: [...cookies, ...jar(res.headers["set-cookie"])].join("; ") };
}

/** Sends a request that declares a body of `bytes` bytes but sends none; the answer comes from the declared size alone. */
export async function declaredOnly(url: string, headers: Record<string, string>, bytes: number): Promise<number> {
  return new Promise((resolve, reject) => {
    const req = http.request(url, { method: "POST", headers: { ...headers, "content-length": String(bytes) } }, (res) => {
      res.resume();
      resolve(res.statusCode ?? 0);
      req.destroy();
    });
    req.on("error", (e) => (req.destroyed ? undefined : reject(e)));
    req.flushHeaders();
  });
}

/** The Cookie header of a signed-in browser context or request context, for plain Node requests. */
export async function cookieHeader(ctx: BrowserContext | APIRequestContext): Promise<string> {
  const { cookies } = await ctx.storageState();
  return cookies.map((c) => `${c.name}=${c.value}`).join("; ");
}

/** The pid of the test server (server.mjs writes it: tests/e2e/serve.sh). */
export function serverPid(): number {
  return Number(readFileSync(path.resolve(import.meta.dirname, "../.generated/server.pid"), "utf8").trim());
}

/** Resident memory of a process in MiB, from /proc/<pid>/status. */
export function rssMiB(pid: number): number {
  const line = readFileSync(`/proc/${pid}/status`, "utf8")
    .split("\n")
    .find((l) => l.startsWith("VmRSS:"));
  return Number(/(\d+)/.exec(line ?? "")?.[1] ?? NaN) / 1024;
}

/**
 * Streams `totalMiB` MiB (chunked, no Content-Length) to the app and returns its status, while
 * sampling the server's memory; the peak is taken until the stream ends or the server answers.
 */
export async function streamAt(
  url: string,
  headers: Record<string, string>,
  totalMiB: number,
  pid: number,
  framing: { head?: Buffer; tail?: Buffer } = {},
): Promise<{ status: number; peakMiB: number; sentMiB: number }> {
  let peak = rssMiB(pid);
  const sampler = setInterval(() => (peak = Math.max(peak, rssMiB(pid))), 25);
  let sent = 0;
  const status = await new Promise<number>((resolve) => {
    const req = http.request(url, { method: "POST", headers: { ...headers, "transfer-encoding": "chunked" } }, (res) => {
      res.resume();
      resolve(res.statusCode ?? 0);
    });
    // the server may close the connection once it has answered: the answer above counts
    req.on("error", () => resolve(-1));
    if (framing.head) req.write(framing.head);
    const chunk = Buffer.alloc(1024 * 1024, 0x61);
    const write = () => {
      while (sent < totalMiB) {
        sent++;
        if (!req.write(chunk)) {
          req.once("drain", write);
          return;
        }
      }
      req.end(framing.tail);
    };
    write();
  });
  await new Promise((r) => setTimeout(r, 300));
  clearInterval(sampler);
  peak = Math.max(peak, rssMiB(pid));
  return { status, peakMiB: peak, sentMiB: sent };
}
