import { NextResponse } from "next/server";
import { z } from "zod";
import type { Area } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { issuesOf } from "@/lib/office/schemas";
import { Refusal } from "@/lib/office/refusal";
import { requireApiArea } from "./session";

// Route handlers for the office side: role check first, then the body validated with zod, and
// every refusal answered as 4xx JSON { error, issues[] } — never a 500 for bad input.

export type Handler<P> = (ctx: { req: Request; user: SessionUser; params: P }) => Promise<Response>;

export function guarded<P = Record<string, never>>(area: Area, handler: Handler<P>) {
  return async (req: Request, ctx: { params: Promise<P> }): Promise<Response> => {
    const auth = await requireApiArea(area);
    if (auth.response) return auth.response;
    try {
      return await handler({ req, user: auth.user, params: ctx?.params ? await ctx.params : ({} as P) });
    } catch (e) {
      return answerError(e);
    }
  };
}

export function answerError(e: unknown): Response {
  if (e instanceof Refusal) return NextResponse.json({ error: e.message, issues: e.issues }, { status: e.status });
  if (e instanceof z.ZodError) return NextResponse.json({ error: "Check the marked fields.", issues: issuesOf(e) }, { status: 400 });
  console.error("[office] unexpected error", e);
  return NextResponse.json({ error: "Something went wrong on our side; nothing was changed. Try again." }, { status: 500 });
}

export async function readJson<S extends z.ZodType>(req: Request, schema: S): Promise<z.output<S>> {
  let raw: unknown;
  try {
    raw = await req.json();
  } catch {
    throw new Refusal("The request body is not valid JSON.", 400);
  }
  return schema.parse(raw);
}

export const uuidParam = z.uuid("not a valid id");
export function idFrom(value: string): string {
  const r = uuidParam.safeParse(value);
  if (!r.success) throw new Refusal("Not found.", 404);
  return r.data;
}
