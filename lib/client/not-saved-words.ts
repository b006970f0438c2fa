import { issuesOf } from "@/lib/zod-issues";
import { storeFailureMessage } from "./not-saved";

/**
 * What a failed bench save says (`./not-saved.ts`): the store's trouble in workshop words, or the
 * entry's own checks' words (zod's messages as lib/zod-issues.ts words them), never an error's
 * technical text.
 */
export function notSavedText(e: unknown): string {
  const store = storeFailureMessage(e);
  if (store) return store;
  const checks = checksSaid(e);
  if (checks) return `Not saved: ${checks}`;
  return "Not saved: something went wrong on the tablet. Record it again; if it keeps failing, reload the bench.";
}

/** A refusal by an entry's own checks (a zod error), its problems in workshop words; null for any other error. */
export function checksSaid(e: unknown): string | null {
  if (!e || typeof e !== "object" || !("issues" in e)) return null;
  const issues = issuesOf(e as Parameters<typeof issuesOf>[0]);
  return issues.length ? issues.map((i) => i.message).join(" ") : null;
}
