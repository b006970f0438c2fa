import "server-only";
import { Refusal } from "@/lib/errors";

/**
 * Why photos could not be stored, in words for the office: a refusal says its own reason; anything
 * else (the object store or the database not answering, with its hosts and ports) is logged for the
 * workshop's own people and said plainly, never passed on as it came.
 */
export function photoStoreTrouble(e: unknown): string {
  if (e instanceof Refusal) return e.message;
  console.error("[photos] could not be stored", e);
  return "the photo store did not answer";
}
