import type { Kysely } from "kysely";
import type { ZodError } from "zod";
import { canReach } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { SYNC_LIMITS, syncBatchSchema } from "@/lib/sync/operations";
import type { Database } from "../schema";
import { mergeBatch } from "./merge";

// POST /api/sync without next-auth: the route passes the signed-in user (or null); tests pass their own.
//   401 not signed in · 403 role cannot reach the bench · 413 body or batch too large
//   400 body not JSON (or not UTF-8) · 422 batch does not match the format (zod issues: path + message)
//   503 the merge failed and nothing from the batch was saved (send it again) · 200 the merge result

const MAX_ISSUES = 50;

function error(status: number, body: Record<string, unknown>): Response {
  return Response.json(body, { status, headers: { "cache-control": "no-store" } });
}

type BodyRead = { ok: true; text: string } | { ok: false; status: 400 | 413; reason: string };

/** Reads the body, stopping as soon as it passes `limit` bytes (a missing or false Content-Length does not help). */
async function readBody(request: Request, limit: number): Promise<BodyRead> {
  const declared = request.headers.get("content-length");
  if (declared !== null && Number(declared) > limit) {
    return { ok: false, status: 413, reason: `The body is ${declared} bytes; the limit is ${limit} bytes. Send the outbox in smaller batches.` };
  }
  if (!request.body) return { ok: true, text: "" };
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel().catch(() => undefined);
      return { ok: false, status: 413, reason: `The body is over ${limit} bytes, the limit. Send the outbox in smaller batches.` };
    }
    chunks.push(value);
  }
  const bytes = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    bytes.set(c, at);
    at += c.byteLength;
  }
  try {
    return { ok: true, text: new TextDecoder("utf-8", { fatal: true }).decode(bytes) };
  } catch {
    return { ok: false, status: 400, reason: "The body is not UTF-8 text." };
  }
}

export function zodIssues(e: ZodError): { path: string; message: string }[] {
  return e.issues.slice(0, MAX_ISSUES).map((i) => ({ path: i.path.map(String).join(".") || "(batch)", message: i.message }));
}

export async function handleSyncRequest(
  request: Request,
  user: SessionUser | null,
  db: Kysely<Database>,
): Promise<Response> {
  if (!user) return error(401, { error: "Sign in first." });
  if (!canReach(user.role, "bench")) return error(403, { error: `Your role (${user.role}) may not use this.` });

  const body = await readBody(request, SYNC_LIMITS.maxBodyBytes);
  if (!body.ok) return error(body.status, { error: body.reason });
  if (!body.text.trim()) return error(400, { error: "The body is empty: send a JSON batch { deviceId, cursor, operations }." });

  let json: unknown;
  try {
    json = JSON.parse(body.text);
  } catch (e) {
    return error(400, { error: `The body is not valid JSON: ${(e as Error).message}` });
  }

  const ops = (json as { operations?: unknown } | null)?.operations;
  if (Array.isArray(ops) && ops.length > SYNC_LIMITS.maxOperations) {
    return error(413, {
      error: `The batch has ${ops.length} operations; the limit is ${SYNC_LIMITS.maxOperations}. Send the outbox in smaller batches.`,
    });
  }

  const parsed = syncBatchSchema.safeParse(json);
  if (!parsed.success) {
    const issues = zodIssues(parsed.error);
    return error(422, {
      error: "The batch does not match the sync format; nothing was saved.",
      issues,
      ...(parsed.error.issues.length > MAX_ISSUES ? { moreIssues: parsed.error.issues.length - MAX_ISSUES } : {}),
    });
  }

  try {
    const result = await mergeBatch(db, user, parsed.data);
    return Response.json(result, { headers: { "cache-control": "no-store" } });
  } catch (e) {
    console.error("sync merge failed", e);
    return error(503, { error: "The batch could not be saved; nothing from it was kept. Send it again." });
  }
}
