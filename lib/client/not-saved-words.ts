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
  if (e && typeof e === "object" && "issues" in e) {
    const issues = issuesOf(e as Parameters<typeof issuesOf>[0]);
    if (issues.length) return `Not saved: ${issues.map((i) => i.message).join(" ")}`;
  }
  return "Not saved: something went wrong on the tablet. Record it again; if it keeps failing, reload the bench.";
}
