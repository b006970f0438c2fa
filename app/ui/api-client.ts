"use client";

import type { ErrorBody, FieldIssue } from "@/lib/errors";
import { noReasonGiven } from "@/lib/errors";

export type { FieldIssue };

/**
 * A value as it arrives in the browser after JSON: dates become ISO strings. The office's pages
 * type what a route answers as `Wire<ReplyOf<typeof GET>>`, taken from the route itself.
 */
export type Wire<T> = T extends Date
  ? string
  : T extends ReadonlyArray<infer U>
    ? Wire<U>[]
    : T extends object
      ? { [K in keyof T]: Wire<T[K]> }
      : T;

// Browser-side calls to our route handlers. A refusal arrives as { error, issues[] } (lib/errors.ts)
// and is thrown as ApiError so forms can show the message and each field's problem beside the field.
export class ApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly issues: FieldIssue[] = [],
  ) {
    super(message);
  }
}

export async function api<T>(method: "GET" | "POST" | "PUT", url: string, body?: unknown): Promise<T> {
  const init: RequestInit = { method, headers: {} };
  if (body instanceof FormData) init.body = body;
  else if (typeof body === "string") {
    init.body = body;
    (init.headers as Record<string, string>)["content-type"] = "application/json";
  } else if (body !== undefined) {
    init.body = JSON.stringify(body);
    (init.headers as Record<string, string>)["content-type"] = "application/json";
  }
  const res = await fetch(url, init);
  const data = await res.json().catch(() => ({}));
  if (!res.ok) {
    const refusal = data as Partial<ErrorBody>;
    throw new ApiError(refusal.error ?? noReasonGiven(res.status), res.status, refusal.issues ?? []);
  }
  return data as T;
}

// Field → first message, from zod issues (client side) or the server's issues.
export function fieldErrors(issues: FieldIssue[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues) out[i.path] ??= i.message;
  return out;
}
