// Ids in Benchtag are UUIDs (PostgreSQL uuid). A route or page checks one before it reaches a query,
// so a malformed id is "not found" (or the route's own refusal), never a database error.
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isUuid(value: unknown): value is string {
  return typeof value === "string" && UUID.test(value);
}
