import { NextResponse, type NextRequest } from "next/server";
import { pageSecurityPolicy } from "@/lib/security-headers";

// Every page answer gets a Content-Security-Policy with a nonce of its own (lib/security-headers.ts).
// Next reads the policy from the request headers and puts the nonce on the scripts it writes.
// API routes, static files and the service worker are not matched here (their headers come from
// next.config.mjs): the proxy never sees a request body, so nothing is buffered for it.
export function proxy(req: NextRequest) {
  const nonce = Buffer.from(crypto.randomUUID()).toString("base64");
  const policy = pageSecurityPolicy(nonce, { dev: process.env.NODE_ENV !== "production" });
  const headers = new Headers(req.headers);
  headers.set("content-security-policy", policy);
  headers.set("x-nonce", nonce);
  const res = NextResponse.next({ request: { headers } });
  res.headers.set("content-security-policy", policy);
  return res;
}

export const config = {
  matcher: ["/((?!api/|_next/|sw\\.js|swe-worker-|icons/|manifest\\.webmanifest|favicon\\.ico|robots\\.txt).*)"],
};
