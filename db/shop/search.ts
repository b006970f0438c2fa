import "server-only";
// A user's search text as an ILIKE pattern that matches it anywhere, with % _ \ taken literally.
export function containsPattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
}
