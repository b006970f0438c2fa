import "server-only";
import { Refusal } from "@/lib/errors";

export interface BodyLimit {
  /** The most bytes the route reads; more is refused with 413 before it is buffered. */
  maxBytes: number;
  /** Said after the size refusal, e.g. "Send the outbox in smaller batches." */
  tooLargeHint?: string;
}

/**
 * Reads a request's body, stopping as soon as it passes the limit: a Content-Length over the
 * limit is refused before reading, and a body without one (or with a false one) is counted
 * while it streams in, so no more than the limit is ever held in memory.
 */
export async function readLimited(req: Request, { maxBytes, tooLargeHint }: BodyLimit): Promise<Uint8Array> {
  const hint = tooLargeHint ? ` ${tooLargeHint}` : "";
  const declared = req.headers.get("content-length");
  if (declared !== null && Number(declared) > maxBytes) {
    throw new Refusal(`The body is ${declared} bytes; the limit is ${maxBytes} bytes.${hint}`, 413);
  }
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw new Refusal(`The body is over ${maxBytes} bytes, the limit.${hint}`, 413);
    }
    chunks.push(value);
  }
  const bytes = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    bytes.set(c, at);
    at += c.byteLength;
  }
  return bytes;
}
