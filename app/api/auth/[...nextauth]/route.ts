import NextAuth from "next-auth";
import { NextRequest } from "next/server";
import { authOptions } from "@/app/_server/auth-options";
import { KIB, publicRoute, text } from "@/app/_server/route";

// next-auth's own endpoints (sign-in, sign-out, session, CSRF token). No session guards them: the
// check is next-auth's CSRF token and the rate-limited credentials check (auth-options.ts). Its
// posts still pass the wrapper's same-origin, content-type and size checks; the body, read within
// the limit, is handed on to next-auth in a fresh request.
const nextAuth = NextAuth(authOptions) as (req: NextRequest, ctx: { params: Promise<{ nextauth: string[] }> }) => Promise<Response>;

function forward(req: Request, path: string, body?: string): Promise<Response> {
  const headers = new Headers(req.headers);
  headers.delete("content-length");
  const fresh = new NextRequest(req.url, { method: req.method, headers, body });
  return nextAuth(fresh, { params: Promise.resolve({ nextauth: path.split("/").filter(Boolean) }) });
}

export const GET = publicRoute({ check: "next-auth", params: ["nextauth"] }, async ({ req, params }) => forward(req, params.nextauth));

export const POST = publicRoute(
  { check: "next-auth", params: ["nextauth"], body: text(["application/x-www-form-urlencoded", "application/json"], 64 * KIB) },
  async ({ req, params, body }) => forward(req, params.nextauth, body),
);
